import { Body, Controller, Param, Query } from '@nestjs/common';
import type { Page, SiteView } from '@gyre/shared';
import { CurrentCaller, type Caller } from '../auth/decorators';
import { ReasonQueryDto } from '../common/dto/reason-query.dto';
import {
  CreateRoute,
  DeleteRoute,
  ListRoute,
  ReadRoute,
  UpdateRoute,
} from '../common/http/resource-routes';
import { ScopedController } from '../common/http/scoped-controller';
import { CreateSiteDto, SiteQueryDto, UpdateSiteDto } from './dto/site.dto';
import { SitesService } from './sites.service';

const NOT_FOUND = 'No such site in your scope';

@ScopedController('sites')
@Controller('sites')
export class SitesController {
  constructor(private readonly sites: SitesService) {}

  @ListRoute('Site', 'SiteView', { description: 'The sites in your scope' })
  list(@CurrentCaller() caller: Caller, @Query() query: SiteQueryDto): Promise<Page<SiteView>> {
    return this.sites.list(caller, query);
  }

  @ReadRoute('Site', 'SiteView', { description: 'One site', notFound: NOT_FOUND })
  get(@CurrentCaller() caller: Caller, @Param('id') id: string): Promise<SiteView> {
    return this.sites.get(caller, id);
  }

  @CreateRoute('Site', 'SiteView', {
    description: 'The new site (audited)',
    conflict: 'The study already has a site with this code',
  })
  create(@CurrentCaller() caller: Caller, @Body() body: CreateSiteDto): Promise<SiteView> {
    return this.sites.create(caller, body);
  }

  @UpdateRoute('Site', 'SiteView', { description: 'The changed site', notFound: NOT_FOUND })
  update(
    @CurrentCaller() caller: Caller,
    @Param('id') id: string,
    @Body() body: UpdateSiteDto,
  ): Promise<SiteView> {
    return this.sites.update(caller, id, body);
  }

  @DeleteRoute('Site', { conflict: 'The site still has participants or users' })
  remove(
    @CurrentCaller() caller: Caller,
    @Param('id') id: string,
    @Query() query: ReasonQueryDto,
  ): Promise<void> {
    return this.sites.remove(caller, id, query.reason);
  }
}
