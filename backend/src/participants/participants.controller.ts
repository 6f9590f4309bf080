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
import type { Page, ParticipantListItem, ParticipantView } from '@gyre/shared';
import { CurrentCaller, RequirePermission, type Caller } from '../auth/decorators';
import {
  CreateParticipantDto,
  ParticipantPageDto,
  ParticipantQueryDto,
  ParticipantResponseDto,
  UpdateParticipantDto,
} from './dto/participant.dto';
import { ParticipantsService } from './participants.service';

@ApiTags('participants')
@ApiBearerAuth()
@ApiForbiddenResponse({ description: 'The role may never do this' })
@Controller('participants')
export class ParticipantsController {
  constructor(private readonly participants: ParticipantsService) {}

  @Get()
  @RequirePermission('read', 'Participant')
  @ApiOkResponse({ type: ParticipantPageDto })
  list(
    @CurrentCaller() caller: Caller,
    @Query() query: ParticipantQueryDto,
  ): Promise<Page<ParticipantListItem>> {
    return this.participants.list(caller, query);
  }

  @Get(':id')
  @RequirePermission('read', 'Participant')
  @ApiOkResponse({ type: ParticipantResponseDto })
  @ApiNotFoundResponse({ description: 'No such participant in your scope' })
  get(
    @CurrentCaller() caller: Caller,
    @Param('id', ParseUUIDPipe) id: string,
  ): Promise<ParticipantView> {
    return this.participants.get(caller, id);
  }

  @Post()
  @RequirePermission('create', 'Participant')
  @ApiCreatedResponse({ type: ParticipantResponseDto })
  @ApiConflictResponse({ description: 'The code is taken in this study' })
  create(
    @CurrentCaller() caller: Caller,
    @Body() body: CreateParticipantDto,
  ): Promise<ParticipantView> {
    return this.participants.create(caller, body);
  }

  @Patch(':id')
  @RequirePermission('update', 'Participant')
  @ApiOkResponse({ type: ParticipantResponseDto })
  @ApiNotFoundResponse({ description: 'No such participant in your scope' })
  update(
    @CurrentCaller() caller: Caller,
    @Param('id', ParseUUIDPipe) id: string,
    @Body() body: UpdateParticipantDto,
  ): Promise<ParticipantView> {
    return this.participants.update(caller, id, body);
  }
}
