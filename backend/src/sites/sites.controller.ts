import {
  Body,
  Controller,
  Delete,
  Get,
  HttpCode,
  Param,
  ParseUUIDPipe,
  Patch,
  Post,
  Query,
} from '@nestjs/common';
import {
  ApiBearerAuth,
  ApiConflictResponse,
  ApiCreatedResponse,
  ApiForbiddenResponse,
  ApiNoContentResponse,
  ApiNotFoundResponse,
  ApiOkResponse,
  ApiTags,
} from '@nestjs/swagger';
import type { Page, SiteView } from '@gyre/shared';
import { CurrentCaller, RequirePermission, type Caller } from '../auth/decorators';
import { ReasonQueryDto } from '../common/dto/reason-query.dto';
import { SiteResponseDto } from '../studies/dto/study-responses.dto';
import { CreateSiteDto, SitePageDto, SiteQueryDto, UpdateSiteDto } from './dto/site.dto';
import { SitesService } from './sites.service';

@ApiTags('sites')
@ApiBearerAuth()
@ApiForbiddenResponse({ description: 'The role may never do this' })
@Controller('sites')
export class SitesController {
  constructor(private readonly sites: SitesService) {}

  @Get()
  @RequirePermission('read', 'Site')
  @ApiOkResponse({ type: SitePageDto })
  list(@CurrentCaller() caller: Caller, @Query() query: SiteQueryDto): Promise<Page<SiteView>> {
    return this.sites.list(caller, query);
  }

  @Get(':id')
  @RequirePermission('read', 'Site')
  @ApiOkResponse({ type: SiteResponseDto })
  @ApiNotFoundResponse({ description: 'No such site in your scope' })
  get(@CurrentCaller() caller: Caller, @Param('id', ParseUUIDPipe) id: string): Promise<SiteView> {
    return this.sites.get(caller, id);
  }

  @Post()
  @RequirePermission('create', 'Site')
  @ApiCreatedResponse({ type: SiteResponseDto })
  @ApiConflictResponse({ description: 'The study already has a site with this code' })
  create(@CurrentCaller() caller: Caller, @Body() body: CreateSiteDto): Promise<SiteView> {
    return this.sites.create(caller, body);
  }

  @Patch(':id')
  @RequirePermission('update', 'Site')
  @ApiOkResponse({ type: SiteResponseDto })
  @ApiNotFoundResponse({ description: 'No such site in your scope' })
  update(
    @CurrentCaller() caller: Caller,
    @Param('id', ParseUUIDPipe) id: string,
    @Body() body: UpdateSiteDto,
  ): Promise<SiteView> {
    return this.sites.update(caller, id, body);
  }

  @Delete(':id')
  @HttpCode(204)
  @RequirePermission('delete', 'Site')
  @ApiNoContentResponse()
  @ApiConflictResponse({ description: 'The site still has participants or users' })
  remove(
    @CurrentCaller() caller: Caller,
    @Param('id', ParseUUIDPipe) id: string,
    @Query() query: ReasonQueryDto,
  ): Promise<void> {
    return this.sites.remove(caller, id, query.reason);
  }
}
