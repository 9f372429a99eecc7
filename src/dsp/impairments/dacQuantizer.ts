import { assertLength, DspError } from '../errors';
import { pow } from '../math/expLog';

/**
 * DAC quantisation of each rail (I and Q) with a uniform mid-rise quantiser of 2^bits levels spanning
 * ±fullScaleAmplitude: step Δ = 2·A_fs/2^bits, y = (⌊x/Δ⌋ + ½)·Δ clamped to ±(A_fs − Δ/2). Values beyond full scale
 * clip. For a busy signal inside full scale the error is close to uniform, of power Δ²/12 per rail (W. R. Bennett,
 * "Spectra of quantized signals", Bell Syst. Tech. J. 27:446–472, 1948), which gives the familiar
 * SQNR = 6.02·bits + 1.76 dB for a full-scale sine.
 * @param inIq 2N values; @param outIq 2N values (may be the same buffer)
 * @returns the share of rail values that clipped (0…1)
 */
export function quantizeDac(inIq: Float64Array, bits: number, fullScaleAmplitude: number, outIq: Float64Array): number {
  if (!Number.isInteger(bits) || bits < 1 || bits > 32) {
    throw new DspError('INVALID_CONFIG', `impairments.dac.bits must be a whole number from 1 to 32; got ${bits}.`, { field: 'impairments.dac.bits' });
  }
  if (!(fullScaleAmplitude > 0) || !Number.isFinite(fullScaleAmplitude)) {
    throw new DspError('INVALID_CONFIG', `impairments.dac full scale must be a positive amplitude; got ${fullScaleAmplitude}.`, {
      field: 'impairments.dac.fullScaleAmplitude',
    });
  }
  assertLength(outIq, inIq.length, 'DAC output');
  const step = (2 * fullScaleAmplitude) / pow(2, bits);
  const top = fullScaleAmplitude - step / 2;
  let clipped = 0;
  for (let i = 0; i < inIq.length; i++) {
    let q = (Math.floor(inIq[i]! / step) + 0.5) * step;
    if (q > top) {
      q = top;
      if (inIq[i]! > fullScaleAmplitude) clipped++;
    } else if (q < -top) {
      q = -top;
      if (inIq[i]! < -fullScaleAmplitude) clipped++;
    }
    outIq[i] = q;
  }
  return clipped / inIq.length;
}

/** Full-scale amplitude that sits `headroomDb` above the RMS amplitude of one rail of `signalIq` (√(P/2)·10^{h/20}). */
export function fullScaleFromHeadroom(signalIq: Float64Array, headroomDb: number): number {
  let power = 0;
  for (let i = 0; i < signalIq.length; i++) power += signalIq[i]! * signalIq[i]!;
  const railRms = Math.sqrt(power / signalIq.length);
  return railRms * pow(10, headroomDb / 20);
}
