import { Body, Controller, Param, Query } from '@nestjs/common';
import type { Page, VisitView } from '@gyre/shared';
import { CurrentCaller, type Caller } from '../auth/decorators';
import { CreateRoute, ListRoute, ReadRoute, UpdateRoute } from '../common/http/resource-routes';
import { ScopedController } from '../common/http/scoped-controller';
import { CreateVisitDto, UpdateVisitDto, VisitQueryDto } from './dto/visit.dto';
import { VisitsService } from './visits.service';

const NOT_FOUND = 'No such visit in your scope';

@ScopedController('visits')
@Controller('visits')
export class VisitsController {
  constructor(private readonly visits: VisitsService) {}

  @ListRoute('Visit', 'VisitView', { description: 'The visits in your scope' })
  list(@CurrentCaller() caller: Caller, @Query() query: VisitQueryDto): Promise<Page<VisitView>> {
    return this.visits.list(caller, query);
  }

  @ReadRoute('Visit', 'VisitView', {
    description: 'One visit with its schedule window',
    notFound: NOT_FOUND,
  })
  get(@CurrentCaller() caller: Caller, @Param('id') id: string): Promise<VisitView> {
    return this.visits.get(caller, id);
  }

  @CreateRoute('Visit', 'VisitView', {
    description: 'The new visit (audited)',
    conflict: 'The participant already has a visit with this label',
  })
  create(@CurrentCaller() caller: Caller, @Body() body: CreateVisitDto): Promise<VisitView> {
    return this.visits.create(caller, body);
  }

  @UpdateRoute('Visit', 'VisitView', { description: 'The changed visit', notFound: NOT_FOUND })
  update(
    @CurrentCaller() caller: Caller,
    @Param('id') id: string,
    @Body() body: UpdateVisitDto,
  ): Promise<VisitView> {
    return this.visits.update(caller, id, body);
  }
}
