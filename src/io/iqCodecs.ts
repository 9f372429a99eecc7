import { DspError } from '../dsp/errors';
import { datatypeInfo, type IqDatatype } from './iqDatatypes';
import { log10 } from '../dsp/math/expLog';

/**
 * What integer quantisation did to a record: clipping and the error it left. Updated chunk by chunk by `encodeIq`.
 * Quantisation SNR = Σ|x|² / Σ|x − x̂|² over the record (x̂ the decoded value), which includes clipping.
 */
export interface QuantisationTally {
  numSamples: number;
  /** Complex samples with I or Q outside the integer range (clipped). */
  clippedSamples: number;
  signalEnergy: number;
  errorEnergy: number;
}

export function createQuantisationTally(): QuantisationTally {
  return { numSamples: 0, clippedSamples: 0, signalEnergy: 0, errorEnergy: 0 };
}

/**
 * Encodes interleaved samples (full scale ±1.0) as `datatype` into `out` (2·N·bytesPerComponent bytes).
 * Floats are stored as given (cf32: rounded to single precision); integers as round(x·fullScale) clipped to the type's
 * range, counting clipped samples and the quantisation error in `tally`.
 * @returns out
 */
export function encodeIq(datatype: IqDatatype, iq: Float64Array, out: Uint8Array, tally?: QuantisationTally): Uint8Array {
  const t = datatypeInfo(datatype);
  if (out.length !== iq.length * t.bytesPerComponent) {
    throw new DspError('LENGTH_MISMATCH', `Encoded ${datatype} buffer has ${out.length} bytes but ${iq.length * t.bytesPerComponent} are required.`);
  }
  const view = new DataView(out.buffer, out.byteOffset, out.byteLength);
  const le = t.littleEndian;
  if (t.kind === 'float') {
    if (t.bytesPerComponent === 4) for (let i = 0; i < iq.length; i++) view.setFloat32(4 * i, iq[i]!, le);
    else for (let i = 0; i < iq.length; i++) view.setFloat64(8 * i, iq[i]!, le);
    return out;
  }
  const fs = t.fullScaleCode;
  const lo = t.minCode;
  const hi = t.maxCode;
  const zero = t.zeroCode;
  let clipped = 0;
  let sig = 0;
  let err = 0;
  for (let i = 0; i < iq.length; i += 2) {
    let sampleClipped = false;
    for (let c = 0; c < 2; c++) {
      const x = iq[i + c]!;
      let code = Math.round(x * fs + zero);
      if (code > hi) {
        code = hi;
        sampleClipped = true;
      } else if (code < lo) {
        code = lo;
        sampleClipped = true;
      }
      const e = (code - zero) / fs - x;
      sig += x * x;
      err += e * e;
      const at = (i + c) * t.bytesPerComponent;
      if (t.bytesPerComponent === 2) view.setInt16(at, code, le);
      else if (t.bytesPerComponent === 1) {
        if (t.kind === 'uint') view.setUint8(at, code);
        else view.setInt8(at, code);
      } else view.setInt32(at, code, le);
    }
    if (sampleClipped) clipped++;
  }
  if (tally) {
    tally.numSamples += iq.length / 2;
    tally.clippedSamples += clipped;
    tally.signalEnergy += sig;
    tally.errorEnergy += err;
  }
  return out;
}

/**
 * Decodes `bytes` (a whole number of samples) of `datatype` to interleaved doubles at full scale ±1.0 into `out`
 * (bytes.length / bytesPerComponent values).
 */
export function decodeIq(datatype: IqDatatype, bytes: Uint8Array, out?: Float64Array): Float64Array {
  const t = datatypeInfo(datatype);
  const n = bytes.length / t.bytesPerComponent;
  if (!Number.isInteger(n / 2)) {
    throw new DspError('LENGTH_MISMATCH', `${bytes.length} bytes are not a whole number of ${datatype} samples.`);
  }
  const values = out ?? new Float64Array(n);
  if (values.length !== n) throw new DspError('LENGTH_MISMATCH', `Decoded ${datatype} buffer has ${values.length} values but ${n} are required.`);
  const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
  const le = t.littleEndian;
  const size = t.bytesPerComponent;
  if (t.kind === 'float') {
    if (size === 4) for (let i = 0; i < n; i++) values[i] = view.getFloat32(4 * i, le);
    else for (let i = 0; i < n; i++) values[i] = view.getFloat64(8 * i, le);
    return values;
  }
  const inv = 1 / t.fullScaleCode;
  if (t.kind === 'uint') {
    for (let i = 0; i < n; i++) values[i] = (view.getUint8(i) - t.zeroCode) * inv;
  } else if (size === 1) {
    for (let i = 0; i < n; i++) values[i] = view.getInt8(i) * inv;
  } else if (size === 2) {
    for (let i = 0; i < n; i++) values[i] = view.getInt16(2 * i, le) * inv;
  } else {
    for (let i = 0; i < n; i++) values[i] = view.getInt32(4 * i, le) * inv;
  }
  return values;
}

/** Quantisation SNR in dB from a tally (Infinity when there was no error). */
export function quantisationSnrDb(tally: QuantisationTally): number {
  return 10 * log10(tally.signalEnergy / tally.errorEnergy);
}
