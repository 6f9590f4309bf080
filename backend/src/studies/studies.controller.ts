import { Body, Controller, Get, Param, ParseUUIDPipe, Patch, Post, Query } from '@nestjs/common';
import {
  ApiBearerAuth,
  ApiCreatedResponse,
  ApiForbiddenResponse,
  ApiNotFoundResponse,
  ApiOkResponse,
  ApiTags,
} from '@nestjs/swagger';
import type { Page, StudyView } from '@gyre/shared';
import { CurrentCaller, RequirePermission, type Caller } from '../auth/decorators';
import { CreateStudyDto, StudyPageDto, StudyQueryDto, UpdateStudyDto } from './dto/study.dto';
import { StudyResponseDto } from './dto/study-responses.dto';
import { StudiesService } from './studies.service';

@ApiTags('studies')
@ApiBearerAuth()
@ApiForbiddenResponse({ description: 'The role may never do this' })
@Controller('studies')
export class StudiesController {
  constructor(private readonly studies: StudiesService) {}

  @Get()
  @RequirePermission('read', 'Study')
  @ApiOkResponse({ type: StudyPageDto })
  list(@CurrentCaller() caller: Caller, @Query() query: StudyQueryDto): Promise<Page<StudyView>> {
    return this.studies.list(caller, query);
  }

  @Get(':id')
  @RequirePermission('read', 'Study')
  @ApiOkResponse({ type: StudyResponseDto })
  @ApiNotFoundResponse({ description: 'No such study in your scope' })
  get(@CurrentCaller() caller: Caller, @Param('id', ParseUUIDPipe) id: string): Promise<StudyView> {
    return this.studies.get(caller, id);
  }

  @Post()
  @RequirePermission('create', 'Study')
  @ApiCreatedResponse({ type: StudyResponseDto })
  create(@CurrentCaller() caller: Caller, @Body() body: CreateStudyDto): Promise<StudyView> {
    return this.studies.create(caller, body);
  }

  @Patch(':id')
  @RequirePermission('update', 'Study')
  @ApiOkResponse({ type: StudyResponseDto })
  @ApiNotFoundResponse({ description: 'No such study in your scope' })
  update(
    @CurrentCaller() caller: Caller,
    @Param('id', ParseUUIDPipe) id: string,
    @Body() body: UpdateStudyDto,
  ): Promise<StudyView> {
    return this.studies.update(caller, id, body);
  }
}
