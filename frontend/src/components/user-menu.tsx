import { Button, Flex, Tag, Typography } from 'antd';

const ROLE_LABELS: Record<string, string> = {
  technician: 'Technician',
  analyst: 'Analyst',
  monitor: 'Monitor',
  coordinator: 'Coordinator',
  admin: 'Administrator',
};

/** Who is signed in, in which role and where, and the way out. */
export function UserMenu({
  name,
  role,
  place,
  onSignOut,
  signingOut = false,
}: {
  name: string;
  role: string;
  /** Study and site, e.g. "ALPHA-AGE · Leiden". */
  place: string | null;
  onSignOut: () => void;
  signingOut?: boolean;
}) {
  return (
    <Flex align="center" gap={12}>
      <Flex vertical align="flex-end" style={{ lineHeight: 1.25 }}>
        <Typography.Text strong>{name}</Typography.Text>
        {place !== null && (
          <Typography.Text type="secondary" style={{ fontSize: 12 }}>
            {place}
          </Typography.Text>
        )}
      </Flex>
      <Tag color="#24525A" variant="outlined" style={{ marginInlineEnd: 0 }}>
        {ROLE_LABELS[role] ?? role}
      </Tag>
      <Button onClick={onSignOut} loading={signingOut}>
        Sign out
      </Button>
    </Flex>
  );
}
