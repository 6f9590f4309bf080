import { Card, Col, Row, Typography } from 'antd';
import { Link } from 'react-router-dom';
import { navEntriesFor } from '../../app/navigation';
import { useAppAbility } from '../../lib/session/ability';
import { useSession } from '../../lib/session/session-context';
import { Worklist } from './components/worklist';
import './home.css';

const WHAT_EACH_SCREEN_IS_FOR: Record<string, string> = {
  Intake: 'Register visits and upload resting and task recordings; follow their checks.',
  Participants: 'Participants of the study and the course of their alpha rhythm over visits.',
  'Study overview':
    'The whole study: group courses by planned visit, what is done, and quality by site.',
  'Study set-up': 'Planned visits and their windows, groups, and when a trend is shown.',
  'Study settings':
    'The analysis settings of the study, every version with what it changed and why.',
  Ledger: 'The audit trail: who changed what, when and why, with its integrity check.',
  'Site check': "Each site's calibration run: Gyre computing a recording with known answers.",
  Reports: 'Signed visit reports of your site, ready to download.',
  Team: 'Users, roles, sites and invitations.',
  Outbox: 'E-mail Gyre has sent or is about to send.',
};

/**
 * The start screen after sign-in: the worklist for those who have one (analysts, monitors,
 * technicians), then the screens of the user's role, one line each.
 */
/** `notices`: what the app puts above the worklist (a failed calibration, app/router.tsx). */
export function HomePage({ notices }: { notices?: React.ReactNode }) {
  const { me } = useSession();
  const ability = useAppAbility();
  const entries = navEntriesFor(me.user.role, ability);
  const hasWorklist = ability.can('read', 'Worklist');
  return (
    <>
      <Typography.Title level={2} className="gyre-flush-top">
        Welcome, {me.user.name}
      </Typography.Title>
      <Typography.Paragraph type="secondary" className="gyre-home-intro">
        Gyre follows each participant&apos;s alpha rhythm from visit to visit: the individual alpha
        frequency at rest, and whether the rhythm slows after stimulus onset in the task.
        {me.study !== null && ` You work in ${me.study.name} (${me.study.code}).`}
      </Typography.Paragraph>
      {notices}
      {hasWorklist && (
        <div className="gyre-below-lg">
          <Worklist />
        </div>
      )}
      {hasWorklist && (
        <Typography.Title level={4} className="gyre-flush-top">
          Your screens
        </Typography.Title>
      )}
      <Row gutter={[16, 16]}>
        {entries.map((entry) => (
          <Col key={entry.path} xs={24} md={12} xl={8}>
            <Link to={entry.path} className="gyre-block gyre-fill-height">
              <Card hoverable size={hasWorklist ? 'small' : 'medium'} className="gyre-fill-height">
                <Typography.Title
                  level={hasWorklist ? 5 : 4}
                  className="gyre-flush-top gyre-screen-card-title"
                >
                  {entry.label}
                </Typography.Title>
                <Typography.Text type="secondary">
                  {WHAT_EACH_SCREEN_IS_FOR[entry.label] ?? ''}
                </Typography.Text>
              </Card>
            </Link>
          </Col>
        ))}
      </Row>
    </>
  );
}
