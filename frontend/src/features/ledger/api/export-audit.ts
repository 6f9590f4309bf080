import dayjs from 'dayjs';
import { apiDownload, saveBlob, withQuery } from '../../../lib/api-client';
import type { AuditFilters } from './audit-filters';

/** `GET /api/audit/export.csv`: the filtered trail as CSV, oldest first; the export is audited. */
export function auditExportPath(filters: AuditFilters): string {
  return withQuery('/api/audit/export.csv', { ...filters });
}

export async function exportAudit(filters: AuditFilters): Promise<void> {
  const { blob, fileName } = await apiDownload(auditExportPath(filters));
  saveBlob(blob, fileName ?? `gyre-audit-${dayjs().format('YYYY-MM-DD')}.csv`);
}
