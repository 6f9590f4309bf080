import { useCallback, useState } from 'react';

const STORAGE_PREFIX = 'gyre.intake.dismissed.';

function read(key: string): string[] {
  try {
    const value: unknown = JSON.parse(window.sessionStorage.getItem(key) ?? '[]');
    return Array.isArray(value) ? value.filter((id): id is string => typeof id === 'string') : [];
  } catch {
    return [];
  }
}

/**
 * Rejected recordings this user has dismissed from Intake's list, for this browser tab's
 * session. Only the view hides them: the server keeps every rejected row (its checksum and
 * reason) and its audit entries as evidence.
 */
export function useDismissedRecordings(userId: string) {
  const key = `${STORAGE_PREFIX}${userId}`;
  const [ids, setIds] = useState<ReadonlySet<string>>(() => new Set(read(key)));
  const dismiss = useCallback(
    (id: string) =>
      setIds((current) => {
        const next = new Set(current).add(id);
        try {
          window.sessionStorage.setItem(key, JSON.stringify([...next]));
        } catch {
          // Storage full or refused: the row stays hidden until the page is reloaded.
        }
        return next;
      }),
    [key],
  );
  return { dismissed: ids, dismiss };
}
