import { Controller, Get, Param, Res } from '@nestjs/common';
import { ApiOperation } from '@nestjs/swagger';
import { ApiFile } from '../openapi/api-responses';
import type { Response } from 'express';
import { CurrentCaller, RequirePermission, type Caller } from '../auth/decorators';
import { ScopedController } from '../common/http/scoped-controller';
import { StudyExportsService } from './study-exports.service';

@ScopedController('study-exports', 'Only analysts and monitors (their study) and admins export')
@Controller('studies/:studyId')
export class StudyExportsController {
  constructor(private readonly exports: StudyExportsService) {}

  @Get('results.csv')
  @RequirePermission('export', 'Result')
  @ApiOperation({
    summary:
      "The study's current results, one row per participant × visit × recording × measure (audited)",
  })
  @ApiFile('text/csv', 'text/csv (RFC 4180); columns in results-dictionary.csv')
  async results(
    @CurrentCaller() caller: Caller,
    @Param('studyId') studyId: string,
    @Res() response: Response,
  ): Promise<void> {
    await this.exports.resultsCsv(caller, studyId, response);
  }

  @Get('conditions.csv')
  @RequirePermission('export', 'Result')
  @ApiOperation({
    summary:
      'Δf per condition (onset label) and the difference of the compared pair, one row per visit × task recording × condition (audited)',
  })
  @ApiFile('text/csv', 'text/csv (RFC 4180); columns in docs/exports.md')
  async conditions(
    @CurrentCaller() caller: Caller,
    @Param('studyId') studyId: string,
    @Res() response: Response,
  ): Promise<void> {
    await this.exports.conditionsCsv(caller, studyId, response);
  }

  @Get('results-dictionary.csv')
  @RequirePermission('export', 'Result')
  @ApiOperation({ summary: 'The data dictionary of results.csv: one row per column' })
  @ApiFile('text/csv', 'text/csv: column, level, type, unit, description, levels')
  async dictionary(
    @CurrentCaller() caller: Caller,
    @Param('studyId') studyId: string,
    @Res() response: Response,
  ): Promise<void> {
    await this.exports.dictionaryCsv(caller, studyId, response);
  }

  @Get('export.zip')
  @RequirePermission('export', 'Result')
  @ApiOperation({
    summary: "The study's current results as an EEG-BIDS derivatives folder, zipped (audited)",
  })
  @ApiFile('application/zip', 'application/zip, streamed')
  async zip(
    @CurrentCaller() caller: Caller,
    @Param('studyId') studyId: string,
    @Res() response: Response,
  ): Promise<void> {
    await this.exports.exportZip(caller, studyId, response);
  }
}
