import { Controller, Param, Query } from '@nestjs/common';
import type { DueListView } from '@gyre/shared';
import { CurrentCaller, type Caller } from '../auth/decorators';
import { ReadRoute } from '../common/http/resource-routes';
import { ScopedController } from '../common/http/scoped-controller';
import { DueQueryDto } from './dto/due-query.dto';
import { DueVisitsService } from './due-visits.service';

@ScopedController('visits')
@Controller('studies/:studyId/due')
export class DueVisitsController {
  constructor(private readonly due: DueVisitsService) {}

  @ReadRoute('Visit', 'DueListView', {
    path: '',
    description: 'Per participant in your scope, the planned visits due or overdue',
    notFound: 'No such study in your scope',
  })
  list(
    @CurrentCaller() caller: Caller,
    @Param('studyId') studyId: string,
    @Query() query: DueQueryDto,
  ): Promise<DueListView> {
    return this.due.list(caller, studyId, query);
  }
}
