import { Card, Typography } from 'antd';
import { ResearchCaution } from '../../components/research-caution';

/** The start screen after sign-in; later screens are reached from the navigation. */
export function HomePage() {
  return (
    <>
      <ResearchCaution />
      <Card>
        <Typography.Title level={3} style={{ marginTop: 0 }}>
          Welcome to Gyre
        </Typography.Title>
        <Typography.Paragraph>
          Gyre follows each participant&apos;s alpha rhythm from visit to visit: the individual
          alpha frequency at rest, and whether the rhythm slows after stimulus onset in the task.
        </Typography.Paragraph>
      </Card>
    </>
  );
}
