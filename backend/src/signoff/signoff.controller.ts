import {
  Body,
  Controller,
  Get,
  HttpCode,
  HttpStatus,
  Param,
  Post,
  Query,
  Res,
  StreamableFile,
} from '@nestjs/common';
import type { Response } from 'express';
import { ApiBearerAuth, ApiConflictResponse, ApiOperation, ApiTags } from '@nestjs/swagger';
import type { Page, ReportRevisionView, ReportSignOffView } from '@gyre/shared';
import { ApiFile, ApiResult } from '../openapi/api-responses';
import { CurrentCaller, RequirePermission } from '../auth/decorators';
import type { Caller } from '../auth/decorators';
import { RevisionListQueryDto } from './dto/revision-list-query.dto';
import { SignReportDto } from './dto/sign-report.dto';
import { ReportRevisionsService } from './report-revisions.service';
import type { PdfFile } from './signoff.service';
import { SignoffService } from './signoff.service';

@ApiTags('reports')
@ApiBearerAuth()
@Controller()
export class SignoffController {
  constructor(
    private readonly signoff: SignoffService,
    private readonly revisions: ReportRevisionsService,
  ) {}

  @Get('visits/:visitId/report/sign-off')
  @RequirePermission('read', 'Result')
  @ApiOperation({
    summary: 'Sign-off state: draft fingerprint, pending revision, signed revisions',
  })
  @ApiResult('ReportSignOffView', { description: "The visit's sign-off state" })
  status(
    @CurrentCaller() caller: Caller,
    @Param('visitId') visitId: string,
  ): Promise<ReportSignOffView> {
    return this.signoff.status(caller, visitId);
  }

  @Get('visits/:visitId/report/preview')
  @RequirePermission('read', 'Result')
  @ApiOperation({ summary: 'The draft PDF as it would be signed now (marked DRAFT, not stored)' })
  @ApiFile('application/pdf', 'The draft report, marked DRAFT')
  async preview(
    @CurrentCaller() caller: Caller,
    @Param('visitId') visitId: string,
    @Res({ passthrough: true }) response: Response,
  ): Promise<StreamableFile> {
    return asPdf(await this.signoff.preview(caller, visitId), response, 'inline');
  }

  @Post('visits/:visitId/report/sign')
  @HttpCode(201)
  @RequirePermission('sign', 'Report')
  @ApiOperation({
    summary: 'Sign the report: password again, the meaning, the previewed fingerprint',
  })
  @ApiResult('ReportRevisionView', {
    description: 'The new signed revision',
    status: HttpStatus.CREATED,
  })
  @ApiConflictResponse({ description: 'Already signed and unchanged, or changed since preview' })
  sign(
    @CurrentCaller() caller: Caller,
    @Param('visitId') visitId: string,
    @Body() body: SignReportDto,
  ): Promise<ReportRevisionView> {
    return this.signoff.sign(caller, visitId, body);
  }

  @Get('report-revisions')
  @RequirePermission('read', 'Report')
  @ApiResult('ReportRevisionView', {
    description: 'Signed revisions in scope (coordinators: their site only)',
    page: true,
  })
  list(
    @CurrentCaller() caller: Caller,
    @Query() query: RevisionListQueryDto,
  ): Promise<Page<ReportRevisionView>> {
    return this.revisions.list(caller, query);
  }

  @Get('report-revisions/:revisionId')
  @RequirePermission('read', 'Report')
  @ApiResult('ReportRevisionView', { description: 'One signed revision' })
  get(
    @CurrentCaller() caller: Caller,
    @Param('revisionId') revisionId: string,
  ): Promise<ReportRevisionView> {
    return this.revisions.get(caller, revisionId);
  }

  @Get('report-revisions/:revisionId/file')
  @RequirePermission('export', 'Report')
  @ApiOperation({ summary: "A signed revision's PDF, checked against its SHA-256" })
  @ApiFile('application/pdf', 'The signed PDF as stored')
  async revisionFile(
    @CurrentCaller() caller: Caller,
    @Param('revisionId') revisionId: string,
    @Res({ passthrough: true }) response: Response,
  ): Promise<StreamableFile> {
    return asPdf(await this.revisions.file(caller, revisionId), response, 'attachment');
  }

  @Get('reports/:reportId/file')
  @RequirePermission('export', 'Report')
  @ApiOperation({ summary: 'The newest signed revision of a report as PDF' })
  @ApiFile('application/pdf', 'The signed PDF as stored')
  async reportFile(
    @CurrentCaller() caller: Caller,
    @Param('reportId') reportId: string,
    @Res({ passthrough: true }) response: Response,
  ): Promise<StreamableFile> {
    return asPdf(await this.revisions.latestFileOfReport(caller, reportId), response, 'attachment');
  }
}

function asPdf(
  file: PdfFile,
  response: Response,
  disposition: 'inline' | 'attachment',
): StreamableFile {
  response.setHeader('Cache-Control', 'no-store');
  if (file.sha256 !== null) response.setHeader('X-Content-SHA256', file.sha256);
  if (file.fingerprint !== null) response.setHeader('X-Report-Fingerprint', file.fingerprint);
  response.setHeader(
    'Access-Control-Expose-Headers',
    'Content-Disposition, X-Content-SHA256, X-Report-Fingerprint',
  );
  return new StreamableFile(file.bytes, {
    type: 'application/pdf',
    disposition: `${disposition}; filename="${file.fileName}"`,
    length: file.bytes.length,
  });
}
