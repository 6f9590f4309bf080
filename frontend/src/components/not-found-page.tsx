import { Button, Result } from 'antd';
import { Link } from 'react-router-dom';
import { paths } from '../app/paths';
import { LostIcon } from './state-icons';

export function NotFoundPage() {
  return (
    <Result
      icon={<LostIcon />}
      title="No such page"
      subTitle="The address does not match any screen in Gyre."
      extra={
        <Link to={paths.home}>
          <Button type="primary">Back to the start</Button>
        </Link>
      }
    />
  );
}
