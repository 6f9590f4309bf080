import type { ReportRevisionView } from '@gyre/shared';
import { App } from 'antd';
import { useState } from 'react';
import { ApiError } from '../../../lib/api-client';
import { downloadRevision } from '../api/report-revisions';

/** Downloads a revision's PDF; `busy` is the id of the one on its way, a failure a message. */
export function useRevisionDownload() {
  const { message } = App.useApp();
  const [busy, setBusy] = useState<string | null>(null);
  const download = async (revision: ReportRevisionView) => {
    setBusy(revision.id);
    try {
      await downloadRevision(revision);
    } catch (error) {
      message.error(error instanceof ApiError ? error.message : 'The PDF could not be downloaded.');
    } finally {
      setBusy(null);
    }
  };
  return { busy, download };
}
