import { Button, Result } from 'antd';
import { Link } from 'react-router-dom';
import { paths } from '../app/paths';
import { LockedIcon } from './state-icons';

/** What a user sees on a screen their role does not include: never a blank page. */
export function NotAvailablePage({ role, screen }: { role: string; screen?: string }) {
  return (
    <Result
      icon={<LockedIcon />}
      title="Not available for your role"
      subTitle={`${screen ?? 'This screen'} is not part of the ${role} role in Gyre. If you need it, ask your study's administrator.`}
      extra={
        <Link to={paths.home}>
          <Button type="primary">Back to the start</Button>
        </Link>
      }
    />
  );
}
