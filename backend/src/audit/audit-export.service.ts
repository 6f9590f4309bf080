import { Injectable } from '@nestjs/common';
import type { Response } from 'express';
import { Caller } from '../auth/decorators';
import { pipeline } from 'node:stream/promises';
import { AuditAnchorService } from './audit-anchor.service';
import { csvHeader, csvLine } from './audit-csv';
import { AuditService } from './audit.service';
import { AuditQueryDto } from './dto/audit-query.dto';

@Injectable()
export class AuditExportService {
  constructor(
    private readonly audit: AuditService,
    private readonly anchors: AuditAnchorService,
  ) {}

  /** Records the export first (so it is in the trail even if the download breaks), then streams. */
  async streamCsv(caller: Caller, query: AuditQueryDto, response: Response): Promise<void> {
    const filters = { ...query, page: undefined, pageSize: undefined };
    await this.beginExport(caller, { format: 'csv', filters }, response, {
      contentType: 'text/csv; charset=utf-8',
      fileName: `gyre-audit-${today()}.csv`,
    });
    response.write(csvHeader());
    for await (const entry of this.audit.iterate(caller.ability, query)) {
      if (!response.write(csvLine(entry))) {
        await new Promise<void>((resolve) => response.once('drain', () => resolve()));
      }
    }
    response.end();
  }

  /**
   * The signed checkpoints as stored (JSON Lines, byte for byte, so each line's link to the one
   * before can be recomputed), beside the CSV whose columns stay as they are. Audited first.
   */
  async streamAnchors(caller: Caller, response: Response): Promise<void> {
    await this.beginExport(caller, { format: 'anchors-jsonl' }, response, {
      contentType: 'application/x-ndjson; charset=utf-8',
      fileName: `gyre-audit-anchors-${today()}.jsonl`,
    });
    response.setHeader('X-Gyre-Anchor-Key-Sha256', this.anchors.keyFingerprint());
    const file = this.anchors.openAnchorFile();
    if (file === null) {
      response.end();
      return;
    }
    await pipeline(file, response);
  }

  /** Records the export in the trail, then opens the download (status, type, file name). */
  private async beginExport(
    caller: Caller,
    after: Record<string, unknown>,
    response: Response,
    download: { contentType: string; fileName: string },
  ): Promise<void> {
    await this.audit.record({
      actor: caller.user,
      action: 'export',
      objectType: 'AuditEntry',
      objectId: null,
      after,
      clientIp: caller.clientIp,
    });
    response.status(200);
    response.setHeader('Content-Type', download.contentType);
    response.setHeader('Content-Disposition', `attachment; filename="${download.fileName}"`);
  }
}

/** Today's date (UTC) for a download's file name. */
const today = (): string => new Date().toISOString().slice(0, 10);
