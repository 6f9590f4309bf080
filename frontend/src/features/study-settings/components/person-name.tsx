import { subject } from '@gyre/shared';
import { useAppAbility } from '../../../lib/session/ability';
import { useUser } from '../../../lib/users';

/**
 * Who saved a version: by name when the rules let the viewer read them (a monitor), "you" for
 * oneself, "Gyre" for the defaults it wrote, otherwise "an analyst": never a bare identifier.
 */
export function PersonName({
  userId,
  meId,
  studyId,
}: {
  userId: string | null;
  meId: string;
  studyId: string;
}) {
  const ability = useAppAbility();
  const allowed =
    userId !== null &&
    userId !== meId &&
    ability.can('read', subject('User', { id: userId, studyId }));
  const user = useUser(userId ?? '', allowed);
  if (userId === null) return <>Gyre (the study&apos;s starting settings)</>;
  if (userId === meId) return <>you</>;
  if (user.data !== undefined) return <>{user.data.name}</>;
  return <>an analyst</>;
}
