import type { Action, SubjectName } from '@gyre/shared';
import { useAppAbility } from '../lib/session/ability';
import { useSession } from '../lib/session/session-context';
import { NotAvailablePage } from './not-available-page';

/** Renders `children` only when the user's rules allow `action` on `subject`. */
export function RequireAbility({
  action,
  subject,
  screen,
  children,
}: {
  action: Action;
  subject: SubjectName;
  /** The screen's name, for the "not available" message. */
  screen: string;
  children: React.ReactNode;
}) {
  const ability = useAppAbility();
  const { me } = useSession();
  if (!ability.can(action, subject))
    return <NotAvailablePage role={me.user.role} screen={screen} />;
  return <>{children}</>;
}
