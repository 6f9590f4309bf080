/**
 * For tests: a value with every typed array replaced by its type and bytes (base64), so
 * `expect(bitExact(a)).toEqual(bitExact(b))` holds only when every array is equal to the
 * bit (NaN payloads and −0 included) and every other number is `Object.is`-equal (jest's
 * own rule for numbers).
 */
export function bitExact(value: unknown): unknown {
  if (ArrayBuffer.isView(value)) {
    const bytes = Buffer.from(value.buffer, value.byteOffset, value.byteLength);
    return { [value.constructor.name]: bytes.toString('base64') };
  }
  if (Array.isArray(value)) return value.map(bitExact);
  if (value !== null && typeof value === 'object') {
    return Object.fromEntries(Object.entries(value).map(([k, v]) => [k, bitExact(v)]));
  }
  return value;
}
