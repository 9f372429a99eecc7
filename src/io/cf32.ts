/**
 * cf32_le: IEEE-754 single precision, little endian, I then Q (SigMF `cf32_le`, common practice for raw IQ).
 * Pure: bytes in, bytes out.
 */
export function encodeCf32Le(iq: Float64Array): Uint8Array {
  const bytes = new Uint8Array(iq.length * 4);
  const view = new DataView(bytes.buffer);
  for (let i = 0; i < iq.length; i++) view.setFloat32(4 * i, iq[i]!, true);
  return bytes;
}

/** Decodes cf32_le bytes (length a multiple of 8) to interleaved doubles. */
export function decodeCf32Le(bytes: Uint8Array): Float64Array {
  const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
  const out = new Float64Array(bytes.byteLength / 4);
  for (let i = 0; i < out.length; i++) out[i] = view.getFloat32(4 * i, true);
  return out;
}
