/**
 * Packs a run's named Float64Array series into one blob for SQLite and back:
 * `GYRS` magic, a uint32 index length, a JSON index `[{ name, length }]`, padding to
 * 8 bytes, then the arrays' little-endian bytes one after the other. Curves stay
 * exact (no decimal round trip) and cost 8 bytes a value.
 */
const MAGIC = 0x53525947; // 'GYRS' read as little-endian uint32

interface IndexEntry {
  name: string;
  length: number;
}

export function encodeResultSeries(series: Record<string, Float64Array>): Buffer {
  const index: IndexEntry[] = Object.entries(series).map(([name, values]) => ({
    name,
    length: values.length,
  }));
  const indexBytes = Buffer.from(JSON.stringify(index), 'utf8');
  const dataStart = align8(8 + indexBytes.byteLength);
  const total = dataStart + index.reduce((sum, e) => sum + 8 * e.length, 0);
  const out = Buffer.alloc(total);
  out.writeUInt32LE(MAGIC, 0);
  out.writeUInt32LE(indexBytes.byteLength, 4);
  indexBytes.copy(out, 8);
  let offset = dataStart;
  for (const values of Object.values(series)) {
    const view = new DataView(out.buffer, out.byteOffset + offset, values.length * 8);
    for (let i = 0; i < values.length; i++) view.setFloat64(i * 8, values[i], true);
    offset += values.length * 8;
  }
  return out;
}

export function decodeResultSeries(blob: Uint8Array): Record<string, Float64Array> {
  const bytes = Buffer.from(blob.buffer, blob.byteOffset, blob.byteLength);
  if (bytes.byteLength < 8 || bytes.readUInt32LE(0) !== MAGIC) {
    throw new Error('result series: not a Gyre series blob');
  }
  const indexLength = bytes.readUInt32LE(4);
  const index = JSON.parse(bytes.subarray(8, 8 + indexLength).toString('utf8')) as IndexEntry[];
  const out: Record<string, Float64Array> = {};
  let offset = align8(8 + indexLength);
  for (const entry of index) {
    const view = new DataView(bytes.buffer, bytes.byteOffset + offset, entry.length * 8);
    const values = new Float64Array(entry.length);
    for (let i = 0; i < entry.length; i++) values[i] = view.getFloat64(i * 8, true);
    out[entry.name] = values;
    offset += entry.length * 8;
  }
  return out;
}

function align8(n: number): number {
  return Math.ceil(n / 8) * 8;
}
