import { Body, Controller, Get, Param, ParseUUIDPipe, Patch, Post, Query } from '@nestjs/common';
import {
  ApiBearerAuth,
  ApiConflictResponse,
  ApiCreatedResponse,
  ApiForbiddenResponse,
  ApiNotFoundResponse,
  ApiOkResponse,
  ApiTags,
} from '@nestjs/swagger';
import type { Page, VisitView } from '@gyre/shared';
import { CurrentCaller, RequirePermission, type Caller } from '../auth/decorators';
import {
  CreateVisitDto,
  UpdateVisitDto,
  VisitPageDto,
  VisitQueryDto,
  VisitResponseDto,
} from './dto/visit.dto';
import { VisitsService } from './visits.service';

@ApiTags('visits')
@ApiBearerAuth()
@ApiForbiddenResponse({ description: 'The role may never do this' })
@Controller('visits')
export class VisitsController {
  constructor(private readonly visits: VisitsService) {}

  @Get()
  @RequirePermission('read', 'Visit')
  @ApiOkResponse({ type: VisitPageDto })
  list(@CurrentCaller() caller: Caller, @Query() query: VisitQueryDto): Promise<Page<VisitView>> {
    return this.visits.list(caller, query);
  }

  @Get(':id')
  @RequirePermission('read', 'Visit')
  @ApiOkResponse({ type: VisitResponseDto })
  @ApiNotFoundResponse({ description: 'No such visit in your scope' })
  get(@CurrentCaller() caller: Caller, @Param('id', ParseUUIDPipe) id: string): Promise<VisitView> {
    return this.visits.get(caller, id);
  }

  @Post()
  @RequirePermission('create', 'Visit')
  @ApiCreatedResponse({ type: VisitResponseDto })
  @ApiConflictResponse({ description: 'The participant already has a visit with this label' })
  create(@CurrentCaller() caller: Caller, @Body() body: CreateVisitDto): Promise<VisitView> {
    return this.visits.create(caller, body);
  }

  @Patch(':id')
  @RequirePermission('update', 'Visit')
  @ApiOkResponse({ type: VisitResponseDto })
  @ApiNotFoundResponse({ description: 'No such visit in your scope' })
  update(
    @CurrentCaller() caller: Caller,
    @Param('id', ParseUUIDPipe) id: string,
    @Body() body: UpdateVisitDto,
  ): Promise<VisitView> {
    return this.visits.update(caller, id, body);
  }
}
