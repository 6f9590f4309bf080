import { subject } from '@gyre/shared';
import { useAppAbility } from '../../../lib/session/ability';
import { useUser } from '../../../lib/users';

/**
 * A person of the study by name when the rules let the viewer read them (a monitor), "you"
 * for oneself, otherwise "another analyst": never a bare identifier.
 */
export function PersonName({
  userId,
  meId,
  studyId,
}: {
  userId: string;
  meId: string;
  studyId: string;
}) {
  const ability = useAppAbility();
  const allowed = userId !== meId && ability.can('read', subject('User', { id: userId, studyId }));
  const user = useUser(userId, allowed);
  if (userId === meId) return <>you</>;
  if (user.data !== undefined) return <>{user.data.name}</>;
  return <>another analyst</>;
}
