import { Body, Controller, Param, Query } from '@nestjs/common';
import type { Page, StudyView } from '@gyre/shared';
import { CurrentCaller, type Caller } from '../auth/decorators';
import { CreateRoute, ListRoute, ReadRoute, UpdateRoute } from '../common/http/resource-routes';
import { ScopedController } from '../common/http/scoped-controller';
import { CreateStudyDto, StudyQueryDto, UpdateStudyDto } from './dto/study.dto';
import { StudiesService } from './studies.service';

const NOT_FOUND = 'No such study in your scope';

@ScopedController('studies')
@Controller('studies')
export class StudiesController {
  constructor(private readonly studies: StudiesService) {}

  @ListRoute('Study', 'StudyView', { description: 'The studies in your scope' })
  list(@CurrentCaller() caller: Caller, @Query() query: StudyQueryDto): Promise<Page<StudyView>> {
    return this.studies.list(caller, query);
  }

  @ReadRoute('Study', 'StudyView', { description: 'One study', notFound: NOT_FOUND })
  get(@CurrentCaller() caller: Caller, @Param('id') id: string): Promise<StudyView> {
    return this.studies.get(caller, id);
  }

  @CreateRoute('Study', 'StudyView', { description: 'The new study (audited)' })
  create(@CurrentCaller() caller: Caller, @Body() body: CreateStudyDto): Promise<StudyView> {
    return this.studies.create(caller, body);
  }

  @UpdateRoute('Study', 'StudyView', { description: 'The changed study', notFound: NOT_FOUND })
  update(
    @CurrentCaller() caller: Caller,
    @Param('id') id: string,
    @Body() body: UpdateStudyDto,
  ): Promise<StudyView> {
    return this.studies.update(caller, id, body);
  }
}
