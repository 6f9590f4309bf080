// Hand-written: a Map in insertion order is the whole bound; a cache package would still leave
// the one batched read of the misses to the caller.
/**
 * Values derived from rows that never change once written (analysis runs are only ever
 * inserted), kept by row id so that each is read from the database once: the kept value is
 * the row's for good. At most `capacity` are kept (the one kept longest goes first).
 */
export class KeptById<Value> {
  private readonly kept = new Map<string, Value>();

  constructor(private readonly capacity: number) {}

  /** The values of `ids`: those not kept yet come from one `read` of them all, then stay. */
  get(
    ids: readonly string[],
    read: (missing: string[]) => Iterable<[string, Value]>,
  ): Map<string, Value> {
    const out = new Map<string, Value>();
    const missing: string[] = [];
    for (const id of ids) {
      const kept = this.kept.get(id);
      if (kept === undefined) missing.push(id);
      else out.set(id, kept);
    }
    if (missing.length === 0) return out;
    for (const [id, value] of read(missing)) {
      if (this.kept.size >= this.capacity) {
        this.kept.delete(this.kept.keys().next().value as string);
      }
      this.kept.set(id, value);
      out.set(id, value);
    }
    return out;
  }
}
