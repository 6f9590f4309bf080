import { Injectable } from '@nestjs/common';
import { EntityManager } from 'typeorm';
import type { ReportRevisionView } from '@gyre/shared';
import { ParticipantsService } from '../participants/participants.service';
import { VisitsService } from '../visits/visits.service';
import { ReportRevision } from './report-revision.entity';

@Injectable()
export class RevisionViewsService {
  constructor(
    private readonly participants: ParticipantsService,
    private readonly visits: VisitsService,
  ) {}

  /** Response views of revisions, with the participant code and visit they belong to. */
  async of(manager: EntityManager, rows: ReportRevision[]): Promise<ReportRevisionView[]> {
    if (rows.length === 0) return [];
    const participants = await this.participants.byIds(
      [...new Set(rows.map((r) => r.participantId))],
      manager,
    );
    const visits = await this.visits.byIds([...new Set(rows.map((r) => r.visitId))], manager);
    const codes = new Map(participants.map((p) => [p.id, p.code]));
    const visitById = new Map(visits.map((v) => [v.id, v]));
    return rows.map((row) => {
      const visit = visitById.get(row.visitId);
      return {
        id: row.id,
        reportId: row.reportId,
        visitId: row.visitId,
        participantId: row.participantId,
        siteId: row.siteId,
        revision: row.revision,
        state: row.state,
        participantCode: codes.get(row.participantId) ?? '',
        visitLabel: visit?.label ?? '',
        visitDate: visit?.visitDate ?? '',
        signedById: row.signedById,
        signerName: row.signerName,
        signedAt: row.signedAt,
        meaning: row.meaning,
        pdfSha256: row.pdfSha256,
        pdfSizeBytes: row.pdfSizeBytes,
        supersedesId: row.supersedesId,
        sentAt: row.sentAt,
      };
    });
  }
}

/** `gyre-report-A1-0001-V1-r2.pdf`: only characters every file system and header takes. */
export function revisionFileName(dto: {
  participantCode: string;
  visitLabel: string;
  revision: number | null;
}): string {
  const clean = (text: string) =>
    text
      .normalize('NFKD')
      .replace(/[^A-Za-z0-9._-]+/g, '-')
      .replace(/^-+|-+$/g, '')
      .slice(0, 40) || 'x';
  const revision = dto.revision === null ? 'draft' : `r${dto.revision}`;
  return `gyre-report-${clean(dto.participantCode)}-${clean(dto.visitLabel)}-${revision}.pdf`;
}
