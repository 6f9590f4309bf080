/** What the Ledger is filtered by; the same filters go to the list and to the CSV export. */
export interface AuditFilters {
  actorId?: string;
  action?: string;
  objectType?: string;
  objectId?: string;
  /** Entries about this participant, its visits and what belongs to them. */
  participantId?: string;
  /** ISO 8601 instants, inclusive. */
  from?: string;
  to?: string;
}

export const AUDIT_FILTER_NAMES = [
  'actorId',
  'action',
  'objectType',
  'objectId',
  'participantId',
  'from',
  'to',
] as const;

export function filtersFromSearch(search: URLSearchParams): AuditFilters {
  const filters: AuditFilters = {};
  for (const name of AUDIT_FILTER_NAMES) {
    const value = search.get(name);
    if (value !== null && value !== '') filters[name] = value;
  }
  return filters;
}
