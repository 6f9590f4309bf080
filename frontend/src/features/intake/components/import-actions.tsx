import { Alert, Button, Flex, Progress } from 'antd';
import type { CheckedImport } from '../hooks/use-checked-import';

interface ImportActionsProps {
  checkLabel: string;
  importLabel: string;
  canCheck: boolean;
  /** A clean check of the current choice: nothing else lets the import start. */
  canImport: boolean;
  /** The step under way, its progress and the last failure (from `useCheckedImport`). */
  state: Pick<CheckedImport, 'busy' | 'percent' | 'problem'>;
  onRun: (dryRun: boolean) => void;
}

/** The check and import buttons of an Intake import, its progress while sending, and a failure. */
export function ImportActions({
  checkLabel,
  importLabel,
  canCheck,
  canImport,
  state: { busy, percent, problem },
  onRun,
}: ImportActionsProps) {
  return (
    <>
      <Flex wrap gap={8}>
        <Button
          onClick={() => onRun(true)}
          disabled={!canCheck || busy !== null}
          loading={busy === 'check'}
        >
          {checkLabel}
        </Button>
        <Button
          type="primary"
          onClick={() => onRun(false)}
          disabled={!canImport || busy !== null}
          loading={busy === 'import'}
        >
          {importLabel}
        </Button>
      </Flex>
      {busy !== null && <Progress percent={percent} size="small" aria-label="Sending" />}
      {problem !== null && <Alert type="error" showIcon title={problem} />}
    </>
  );
}
