import { Initial1764633600000 } from './1764633600000-initial';

/** Every migration in order; add new ones at the end (see DEVELOPERS.md). */
export const MIGRATIONS = [Initial1764633600000];
