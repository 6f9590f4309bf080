import { Button, Flex, Grid, Tag, Typography } from 'antd';
import { GYRE_COLORS } from '../app/theme';

const ROLE_LABELS: Record<string, string> = {
  technician: 'Technician',
  analyst: 'Analyst',
  monitor: 'Monitor',
  coordinator: 'Coordinator',
  admin: 'Administrator',
};

/**
 * Who is signed in, in which role and where, and the way out. A long name or place is cut
 * with an ellipsis (the whole text in its tooltip); on phones the role joins the place line.
 */
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
  const wide = Grid.useBreakpoint().md !== false;
  const roleLabel = ROLE_LABELS[role] ?? role;
  const second = wide ? place : [roleLabel, place].filter(Boolean).join(' · ');
  return (
    <Flex align="center" gap={wide ? 12 : 8} className="gyre-shrinkable">
      <Flex
        vertical
        align="flex-end"
        style={{ lineHeight: 1.25, minWidth: 0, maxWidth: wide ? 260 : '100%' }}
      >
        <Typography.Text strong ellipsis={{ tooltip: name }} style={{ maxWidth: '100%' }}>
          {name}
        </Typography.Text>
        {second !== null && second.length > 0 && (
          <Typography.Text
            type="secondary"
            ellipsis={{ tooltip: second }}
            style={{ fontSize: 12, maxWidth: '100%' }}
          >
            {second}
          </Typography.Text>
        )}
      </Flex>
      {wide && (
        <Tag color={GYRE_COLORS.primary} variant="outlined">
          {roleLabel}
        </Tag>
      )}
      <Button onClick={onSignOut} loading={signingOut} className="gyre-no-shrink">
        Sign out
      </Button>
    </Flex>
  );
}
