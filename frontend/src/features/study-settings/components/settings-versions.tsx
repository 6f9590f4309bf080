import type { AnalysisSettingsView } from '@gyre/shared';
import { Flex, Pagination, Skeleton, Tag, Typography } from 'antd';
import { useState } from 'react';
import { GYRE_COLORS } from '../../../app/theme';
import { EmptyState, ReadError } from '../../../components/page-states';
import { formatDateTime } from '../../../lib/format';
import {
  useAnalysisSettingsVersions,
  VERSIONS_PAGE_SIZE,
} from '../api/get-analysis-settings-versions';
import { PersonName } from './person-name';
import { settingChangeText } from './settings-words';
import '../study-settings.css';

function Version({
  version,
  current,
  meId,
}: {
  version: AnalysisSettingsView;
  current: boolean;
  meId: string;
}) {
  return (
    <section aria-label={`Version ${version.version}`} className="gyre-settings-version">
      <Flex gap={8} wrap align="baseline">
        <Typography.Text strong>Version {version.version}</Typography.Text>
        {current && <Tag color={GYRE_COLORS.primary}>current</Tag>}
        <Typography.Text type="secondary" className="gyre-figures">
          {formatDateTime(version.createdAt)} · by{' '}
          <PersonName userId={version.createdById} meId={meId} studyId={version.studyId} />
        </Typography.Text>
      </Flex>
      <Typography.Paragraph className="gyre-settings-reason">
        <q>{version.reason}</q>
      </Typography.Paragraph>
      {version.changes.length === 0 ? (
        <Typography.Text type="secondary">
          {version.version === 1
            ? "The study's first settings."
            : 'No setting differs from the version before.'}
        </Typography.Text>
      ) : (
        <ul
          aria-label={`Changes in version ${version.version}`}
          className="gyre-figures gyre-compact-list"
        >
          {version.changes.map((change) => (
            <li key={change.field}>{settingChangeText(change)}</li>
          ))}
        </ul>
      )}
    </section>
  );
}

/** Every settings version, newest first, each with its reason and what it changed. */
export function SettingsVersions({
  studyId,
  currentVersion,
  meId,
}: {
  studyId: string;
  currentVersion: number | null;
  meId: string;
}) {
  const [page, setPage] = useState(1);
  const versions = useAnalysisSettingsVersions(studyId, page);
  if (versions.error !== undefined) {
    return <ReadError read={versions} title="The versions could not be loaded" />;
  }
  if (versions.data === undefined) return <Skeleton active paragraph={{ rows: 6 }} />;
  if (versions.data.items.length === 0) {
    return <EmptyState description="No settings version yet." />;
  }
  return (
    <>
      <section aria-label="Settings versions">
        {versions.data.items.map((version) => (
          <Version
            key={version.id}
            version={version}
            current={version.version === currentVersion}
            meId={meId}
          />
        ))}
      </section>
      {versions.data.total > VERSIONS_PAGE_SIZE && (
        <Pagination
          className="gyre-above-sm"
          current={page}
          pageSize={VERSIONS_PAGE_SIZE}
          total={versions.data.total}
          onChange={setPage}
          showSizeChanger={false}
          size="small"
        />
      )}
    </>
  );
}
