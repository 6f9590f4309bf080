import type { DueListView, DueVisit } from '@gyre/shared';
import { Button, Card, List, Space, Tag, Typography } from 'antd';
import { GYRE_COLORS } from '../../../app/theme';
import { ErrorState } from '../../../components/page-states';
import { formatCount, formatDate } from '../../../lib/format';

function dueText(item: DueVisit): string {
  if (item.status === 'overdue') {
    return `Overdue by ${formatCount(item.daysOverdue, 'day')}`;
  }
  return `Due until ${formatDate(item.closes)}`;
}

/**
 * Intake's "Due": per participant at the technician's site, the planned visits whose window
 * is open today or closed without a visit. Choosing one opens that participant.
 */
export function DueCard({
  due,
  error,
  onRetry,
  onChoose,
}: {
  due: DueListView | undefined;
  error: unknown;
  onRetry: () => void;
  onChoose: (participantId: string) => void;
}) {
  const overdue =
    due?.participants.filter((p) => p.due.some((d) => d.status === 'overdue')).length ?? 0;
  return (
    <Card
      title="Due"
      role="region"
      aria-label="Due"
      extra={
        due !== undefined && (
          <Typography.Text type="secondary">
            {due.participants.length === 0
              ? `as of ${formatDate(due.asOf)}`
              : `${formatCount(due.participants.length, 'participant')}, ${overdue} overdue`}
          </Typography.Text>
        )
      }
    >
      {error !== undefined ? (
        <ErrorState error={error} onRetry={onRetry} title="What is due could not be loaded" />
      ) : (
        <List
          loading={due === undefined}
          dataSource={due?.participants ?? []}
          locale={{ emptyText: 'No planned visit is due or overdue at your site today.' }}
          renderItem={(participant) => (
            <List.Item
              key={participant.participantId}
              actions={[
                <Button
                  key="open"
                  size="small"
                  onClick={() => onChoose(participant.participantId)}
                  aria-label={`Open ${participant.participantCode}`}
                >
                  Open
                </Button>,
              ]}
            >
              <List.Item.Meta
                title={<span className="gyre-figures">{participant.participantCode}</span>}
                description={
                  <Space orientation="vertical" size={4}>
                    {participant.due.map((item) => (
                      <Space key={item.plannedVisitId} wrap size={8}>
                        <span>{item.plannedVisitName}</span>
                        <Tag color={item.status === 'overdue' ? GYRE_COLORS.amber : undefined}>
                          {dueText(item)}
                        </Tag>
                        <Typography.Text type="secondary" className="gyre-caption">
                          window {formatDate(item.opens)} – {formatDate(item.closes)}
                        </Typography.Text>
                      </Space>
                    ))}
                  </Space>
                }
              />
            </List.Item>
          )}
        />
      )}
      {due !== undefined && due.withoutEnrolmentDate > 0 && (
        <Typography.Paragraph type="secondary" className="gyre-flush gyre-above-sm">
          {due.withoutEnrolmentDate} participant{due.withoutEnrolmentDate === 1 ? ' has' : 's have'}{' '}
          no enrolment date, so nothing can be due for them. Add it under the participant.
        </Typography.Paragraph>
      )}
    </Card>
  );
}
