import { Alert, Button, Skeleton } from 'antd';
import { useAuditVerify } from '../api/audit-verify';

/** Whether every entry still hashes to what the next one links to (SHA-256 chain). */
export function ChainStatus() {
  const { data, error, isLoading, isValidating, mutate } = useAuditVerify();
  const again = (
    <Button size="small" onClick={() => void mutate()} loading={isValidating}>
      Check again
    </Button>
  );
  if (isLoading) return <Skeleton.Input active block style={{ height: 54, marginBottom: 16 }} />;
  if (error !== undefined || data === undefined) {
    return (
      <Alert
        type="warning"
        showIcon
        title="The integrity of the trail could not be checked."
        description={error instanceof Error ? error.message : undefined}
        action={again}
        style={{ marginBottom: 16 }}
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
        description={`${data.checked.toLocaleString('en-GB')} entries checked: each one's hash matches its content and links to the entry before it.`}
        action={again}
        style={{ marginBottom: 16 }}
      />
    );
  }
  return (
    <Alert
      type="error"
      showIcon
      role="alert"
      title="The trail is broken"
      description={
        data.firstBroken !== null
          ? `Entry #${data.firstBroken.seq} does not hold: ${data.firstBroken.reason}. Entries from there on cannot be trusted; tell your administrator.`
          : 'The chain does not hold. Tell your administrator.'
      }
      action={again}
      style={{ marginBottom: 16 }}
    />
  );
}
