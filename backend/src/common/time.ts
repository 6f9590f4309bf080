/** Gyre stores instants as ISO 8601 UTC strings: sortable as text, unambiguous in exports. */
export function nowIso(): string {
  return new Date().toISOString();
}

export function isoAfter(ms: number, from: Date = new Date()): string {
  return new Date(from.getTime() + ms).toISOString();
}
