import type { Role } from '@gyre/shared';

// Spelled out per role rather than guessed from the first letter.
const ARTICLE: Record<Role, 'a' | 'an'> = {
  technician: 'a',
  analyst: 'an',
  monitor: 'a',
  coordinator: 'a',
  admin: 'an',
};

/** "an analyst", "a monitor": the role with its indefinite article, for messages. */
export function aRole(role: Role): string {
  return `${ARTICLE[role]} ${role}`;
}

/** The same at the start of a sentence: "An analyst", "A monitor". */
export function capitalise(text: string): string {
  return text.charAt(0).toUpperCase() + text.slice(1);
}
