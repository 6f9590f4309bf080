import type { ParticipantView, StudyGroupView } from '@gyre/shared';
import { Descriptions } from 'antd';
import { formatDate } from '../../../lib/format';

/**
 * A participant's enrolment date (day 0 of the visit schedule) and group. They are changed by
 * the site's technician in Intake: the roles that open this screen may not change participants.
 */
export function ParticipantDetails({
  participant,
  groups,
}: {
  participant: ParticipantView;
  groups: StudyGroupView[];
}) {
  const group = groups.find((g) => g.id === participant.groupId);
  return (
    <Descriptions
      size="small"
      column={{ xs: 1, md: 3 }}
      aria-label="Enrolment"
      items={[
        {
          key: 'enrolment',
          label: 'Enrolment date',
          children:
            participant.enrolmentDate === null
              ? 'not recorded'
              : formatDate(participant.enrolmentDate),
        },
        {
          key: 'group',
          label: 'Group',
          children: participant.groupId === null ? 'none' : (group?.name ?? '…'),
        },
      ]}
    />
  );
}
