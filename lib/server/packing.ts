/**
 * Measurement points are stored as packed little-endian arrays (BYTEA): exact to the last bit,
 * compact, and fast for 10⁵-point files. These two functions are the only place that packs them.
 */
export function packFloat64(values: ArrayLike<number>): Uint8Array<ArrayBuffer> {
  const buf = new ArrayBuffer(values.length * 8);
  const view = new DataView(buf);
  for (let i = 0; i < values.length; i++) view.setFloat64(i * 8, values[i]!, true);
  return new Uint8Array(buf);
}

export function unpackFloat64(bytes: Uint8Array): number[] {
  if (bytes.byteLength % 8 !== 0) throw new Error(`packed float64 data has ${bytes.byteLength} bytes, not a multiple of 8`);
  const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
  const out = new Array<number>(bytes.byteLength / 8);
  for (let i = 0; i < out.length; i++) out[i] = view.getFloat64(i * 8, true);
  return out;
}

export function packInt32(values: ArrayLike<number>): Uint8Array<ArrayBuffer> {
  const buf = new ArrayBuffer(values.length * 4);
  const view = new DataView(buf);
  for (let i = 0; i < values.length; i++) view.setInt32(i * 4, values[i]!, true);
  return new Uint8Array(buf);
}

export function unpackInt32(bytes: Uint8Array): number[] {
  const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
  const out = new Array<number>(bytes.byteLength / 4);
  for (let i = 0; i < out.length; i++) out[i] = view.getInt32(i * 4, true);
  return out;
}
