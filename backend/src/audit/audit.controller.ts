import { Controller, Get, Query, Res } from '@nestjs/common';
import { ApiOperation } from '@nestjs/swagger';
import type { Response } from 'express';
import type { AuditEntryView, AuditVerifyResult, Page } from '@gyre/shared';
import { ApiFile, ApiResult } from '../openapi/api-responses';
import { CurrentCaller, RequirePermission, type Caller } from '../auth/decorators';
import { ScopedController } from '../common/http/scoped-controller';
import { AuditAnchorService } from './audit-anchor.service';
import { AuditExportService } from './audit-export.service';
import { AuditService } from './audit.service';
import { AuditQueryDto } from './dto/audit-query.dto';

@ScopedController('audit', 'Only monitors (their study) and admins read the trail')
@Controller('audit')
export class AuditController {
  constructor(
    private readonly audit: AuditService,
    private readonly exporter: AuditExportService,
    private readonly anchors: AuditAnchorService,
  ) {}

  @Get()
  @RequirePermission('read', 'AuditEntry')
  @ApiOperation({ summary: 'Audit entries, filtered by actor, action, object and time range' })
  @ApiResult('AuditEntryView', { description: 'The entries, newest first', page: true })
  list(
    @CurrentCaller() caller: Caller,
    @Query() query: AuditQueryDto,
  ): Promise<Page<AuditEntryView>> {
    return this.audit.list(caller.ability, query);
  }

  @Get('verify')
  @RequirePermission('read', 'AuditEntry')
  @ApiOperation({
    summary:
      'Whether the hash chain is intact and agrees with every signed checkpoint (truncation, re-hashing), and the first broken entry',
  })
  @ApiResult('AuditVerifyResult', { description: 'The chain and checkpoint check' })
  verify(): Promise<AuditVerifyResult> {
    return this.audit.verify();
  }

  @Get('export.csv')
  @RequirePermission('export', 'AuditEntry')
  @ApiOperation({ summary: 'The filtered entries as CSV (the export itself is audited)' })
  @ApiFile('text/csv', 'text/csv, one line per entry, oldest first')
  async export(
    @CurrentCaller() caller: Caller,
    @Query() query: AuditQueryDto,
    @Res() response: Response,
  ): Promise<void> {
    await this.exporter.streamCsv(caller, query, response);
  }

  @Get('anchors.jsonl')
  @RequirePermission('export', 'AuditEntry')
  @ApiOperation({
    summary:
      'The signed checkpoints of the chain (audit-anchors.jsonl as stored; the download is audited)',
  })
  @ApiFile(
    'application/x-ndjson',
    'JSON Lines, one Ed25519-signed checkpoint per line, oldest first',
  )
  async exportAnchors(@CurrentCaller() caller: Caller, @Res() response: Response): Promise<void> {
    await this.exporter.streamAnchors(caller, response);
  }

  @Get('anchor-key.pem')
  @RequirePermission('read', 'AuditEntry')
  @ApiOperation({ summary: 'The public key (Ed25519, SPKI PEM) that checks the anchor lines' })
  @ApiFile('application/x-pem-file', 'PEM text')
  anchorKey(@Res() response: Response): void {
    response.status(200);
    response.setHeader('Content-Type', 'application/x-pem-file; charset=utf-8');
    response.setHeader('X-Gyre-Anchor-Key-Sha256', this.anchors.keyFingerprint());
    response.send(this.anchors.publicKeyPem());
  }
}
