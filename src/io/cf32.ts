import { decodeIq, encodeIq } from './iqCodecs';

/**
 * cf32_le: IEEE-754 single precision, little endian, I then Q (SigMF `cf32_le`, common practice for raw IQ).
 * Pure: bytes in, bytes out.
 */
export function encodeCf32Le(iq: Float64Array): Uint8Array {
  return encodeIq('cf32_le', iq, new Uint8Array(iq.length * 4));
}

/** Decodes cf32_le bytes (length a multiple of 8) to interleaved doubles. */
export function decodeCf32Le(bytes: Uint8Array): Float64Array {
  return decodeIq('cf32_le', bytes);
}
