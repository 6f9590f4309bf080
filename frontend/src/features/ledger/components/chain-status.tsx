import type { AuditVerifyResult } from '@gyre/shared';
import { Alert, App, Button, Skeleton } from 'antd';
import { useState } from 'react';
import { formatNumber } from '../../../lib/format';
import { useAuditVerify } from '../api/audit-verify';
import { formatLedgerTime } from '../lib/ledger-time';

const entriesWord = (n: number) => `${formatNumber(n, 0)} ${n === 1 ? 'entry' : 'entries'}`;

/** The result of one check in a line: `Checked 2 Dec 2026, 14:03:12 CET: intact, 41 entries.` */
export function checkSummary(result: AuditVerifyResult, at: string): string {
  return `Checked ${formatLedgerTime(at)}: ${result.intact ? 'intact' : 'broken'}, ${entriesWord(result.checked)} checked.`;
}

/**
 * Whether every entry still hashes to what the next one links to (SHA-256 chain). "Check again"
 * shows it is working, then says when the check ran and what it found.
 */
export function ChainStatus() {
  const [checkedAt, setCheckedAt] = useState<string | null>(null);
  const [checking, setChecking] = useState(false);
  const { message } = App.useApp();
  const { data, error, isLoading, mutate } = useAuditVerify(() =>
    setCheckedAt(new Date().toISOString()),
  );

  const checkAgain = async () => {
    setChecking(true);
    try {
      const result = await mutate();
      if (result !== undefined) {
        const summary = checkSummary(result, new Date().toISOString());
        if (result.intact) void message.success(summary);
        else void message.error(summary);
      }
    } catch {
      void message.error('The check could not run. Try again in a moment.');
    } finally {
      setChecking(false);
    }
  };

  const again = (
    <Button size="small" onClick={() => void checkAgain()} loading={checking}>
      {checking ? 'Checking…' : 'Check again'}
    </Button>
  );
  const when = checkedAt === null ? '' : ` Last checked ${formatLedgerTime(checkedAt)}.`;
  if (isLoading) return <Skeleton.Input active block style={{ height: 54, marginBottom: 16 }} />;
  if (error !== undefined || data === undefined) {
    return (
      <Alert
        type="warning"
        showIcon
        title="The integrity of the trail could not be checked."
        description={error instanceof Error ? error.message : undefined}
        action={again}
        className="gyre-below"
      />
    );
  }
  if (data.intact) {
    return (
      <Alert
        type="success"
        showIcon
        role="status"
        title="The trail is intact"
        description={`${entriesWord(data.checked)} checked: each one's hash matches its content and links to the entry before it.${when}`}
        action={again}
        className="gyre-ledger-chain gyre-below"
      />
    );
  }
  return (
    <Alert
      type="error"
      showIcon
      role="alert"
      title="The trail is broken"
      description={`${
        data.firstBroken !== null
          ? `Entry #${data.firstBroken.seq} does not hold: ${data.firstBroken.reason}. Entries from there on cannot be trusted; tell your administrator.`
          : 'The chain does not hold. Tell your administrator.'
      }${when}`}
      action={again}
      className="gyre-ledger-chain gyre-below"
    />
  );
}
