import { Alert, App, Button, Flex, Typography } from 'antd';
import { useState } from 'react';
import { RESEARCH_CAUTION } from '../../../components/research-caution';
import { ApiError } from '../../../lib/api-client';
import { downloadStudyExport, type StudyExportKind } from '../api/study-exports';

const LABELS: Record<StudyExportKind, string> = {
  'results-csv': 'Results table (CSV)',
  'conditions-csv': 'Conditions table (CSV)',
  'bids-zip': 'BIDS derivatives (ZIP)',
};

/**
 * The study's results exports for statisticians, with the research-use caution. Each
 * download is recorded in the audit trail by the server. Placed by the study overview.
 */
export function StudyExportLinks({ studyId }: { studyId: string }) {
  const { message } = App.useApp();
  const [busy, setBusy] = useState<StudyExportKind | null>(null);
  const download = async (kind: StudyExportKind) => {
    setBusy(kind);
    try {
      await downloadStudyExport(studyId, kind);
    } catch (error) {
      message.error(
        error instanceof ApiError ? error.message : 'The export could not be downloaded.',
      );
    } finally {
      setBusy(null);
    }
  };
  return (
    <section aria-label="Results exports">
      <Alert
        role="note"
        aria-label="Research use caution"
        type="warning"
        showIcon
        title={`${RESEARCH_CAUTION} Exports are for research analysis only, not for diagnosis.`}
        className="gyre-below-sm"
      />
      <Typography.Paragraph type="secondary">
        Current numbers of every visit, with their settings version, code version, input checksum
        and doubt markers. Each download is recorded in the audit trail.
      </Typography.Paragraph>
      <Flex gap={8} wrap>
        {(Object.keys(LABELS) as StudyExportKind[]).map((kind) => (
          <Button
            key={kind}
            loading={busy === kind}
            disabled={busy !== null && busy !== kind}
            onClick={() => void download(kind)}
          >
            {LABELS[kind]}
          </Button>
        ))}
      </Flex>
    </section>
  );
}
