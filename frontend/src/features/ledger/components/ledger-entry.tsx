import type { AuditEntryView } from '@gyre/shared';
import { Button, Flex, Tag, Typography } from 'antd';
import { useId, useState } from 'react';
import { Link } from 'react-router-dom';
import { entrySentence, type LedgerScreen } from '../lib/entry-sentence';
import { formatLedgerTime } from '../lib/ledger-time';
import { EntryChanges } from './entry-changes';
import { GYRE_COLORS } from '../../../app/theme';

const FLAG_ACTIONS = new Set(['raise', 'clear']);
const WARNING_ACTIONS = new Set([
  'sign-in-failed',
  'sign-in-throttled',
  'account-locked',
  'refresh-reuse',
  'reject',
  'fail',
  'sign-refused',
]);

/** One Ledger entry: number, time, the sentence with its link, and its details on demand. */
export function LedgerEntry({
  entry,
  canOpen,
}: {
  entry: AuditEntryView;
  canOpen: (screen: LedgerScreen) => boolean;
}) {
  const [open, setOpen] = useState(false);
  const detailsId = useId();
  const sentence = entrySentence(entry, canOpen);
  const warn = FLAG_ACTIONS.has(entry.action) || WARNING_ACTIONS.has(entry.action);
  return (
    <article aria-label={`Entry ${entry.seq}`} style={{ padding: '10px 0' }}>
      <Flex gap={8} wrap align="baseline" justify="space-between">
        <Typography.Text type="secondary" className="gyre-figures" style={{ fontSize: 13 }}>
          #{entry.seq} · <time dateTime={entry.at}>{formatLedgerTime(entry.at)}</time>
        </Typography.Text>
        <Tag color={warn ? GYRE_COLORS.amberText : undefined}>{entry.action}</Tag>
      </Flex>
      <Typography.Paragraph style={{ margin: '4px 0 0' }} data-testid="ledger-sentence">
        <Typography.Text strong type={sentence.bySystem ? 'secondary' : undefined}>
          {sentence.actor}
        </Typography.Text>{' '}
        {sentence.text}
        {sentence.target !== null && (
          <>
            {' '}
            {sentence.target.to !== null ? (
              <Link to={sentence.target.to}>{sentence.target.label}</Link>
            ) : (
              <Typography.Text>{sentence.target.label}</Typography.Text>
            )}
          </>
        )}
        {sentence.detail !== null && <>: {sentence.detail}</>}
      </Typography.Paragraph>
      <Button
        type="link"
        size="small"
        className="gyre-inline-link"
        aria-expanded={open}
        aria-controls={detailsId}
        onClick={() => setOpen(!open)}
      >
        {open ? 'Hide details' : 'Details'}
      </Button>
      <div id={detailsId} hidden={!open}>
        {open && <EntryChanges entry={entry} />}
      </div>
    </article>
  );
}
