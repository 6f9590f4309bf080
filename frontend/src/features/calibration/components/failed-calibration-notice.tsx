import { Alert } from 'antd';
import { Link } from 'react-router-dom';
import { paths } from '../../../app/paths';
import { useAppAbility } from '../../../lib/session/ability';
import { useLatestCalibrationRuns } from '../api/calibration-runs';

/**
 * On the start page: the sites whose newest calibration run failed, for everyone who may read
 * calibration runs (analysts and monitors of the study, the site's technicians, admins).
 */
export function FailedCalibrationNotice() {
  const canRead = useAppAbility().can('read', 'Calibration');
  const { data } = useLatestCalibrationRuns(canRead);
  const failed = (data ?? []).filter((run) => run.state === 'failed');
  if (failed.length === 0) return null;
  const codes = failed.map((run) => run.siteCode).join(', ');
  return (
    <Alert
      type="error"
      showIcon
      role="alert"
      className="gyre-below-lg"
      title={
        failed.length === 1
          ? `The newest calibration run of site ${codes} failed`
          : `The newest calibration runs of sites ${codes} failed`
      }
      description={
        <>
          Gyre did not reproduce the known answers of its calibration recording there, so results
          computed at {failed.length === 1 ? 'that site' : 'those sites'} may not be right. Read
          which value was off on <Link to={paths.siteCheck}>Site check</Link>.
        </>
      }
    />
  );
}
