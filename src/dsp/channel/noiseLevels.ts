import { DspError } from '../errors';

/**
 * Noise levels of the path, defined once (used by `crestline link`, the tests and the UI):
 * - SNR: mean signal power per sample over the noise variance per sample, both over the full sampled bandwidth f_s
 *   (oversampling included). SNR = P_s / σ².
 * - Es/N0: energy of one data modulation symbol, counted over the useful part of the OFDM symbol (the cyclic prefix is
 *   discarded by the receiver, so its energy is not counted), over the noise density N0 = σ²/f_s. With the unscaled
 *   IFFT of the generator a subcarrier of amplitude a has power |a|² per sample, so Es/N0 = N·E_RE/σ² (N the IFFT size,
 *   E_RE the mean energy |a|² of a data resource element). It equals the SNR per data resource element after the FFT,
 *   and the SNR measured in the occupied bandwidth of a fully loaded grid. DFT spreading is unitary, so it is the same
 *   per data symbol for DFT-s-OFDM.
 * - Eb/N0 = Es/N0 / (bits per data symbol). Reference-signal energy is not charged to Eb (the usual link-level
 *   convention when comparing with the AWGN formulas; add 10·log10(total/data energy) for the overhead).
 * All conversions are exact for a given waveform: its P_s, E_RE and IFFT size are measured, not assumed.
 */
export interface NoiseReference {
  /** Mean |x[n]|² of the waveform over all samples (P_s). */
  readonly signalPowerLinear: number;
  /** Mean |a_k,l|² over the data resource elements (E_RE). */
  readonly dataReEnergyLinear: number;
  /** IFFT size N (fftSize × oversampling). */
  readonly ifftSize: number;
  /** Mean bits carried per data symbol (e.g. 2 for QPSK). */
  readonly bitsPerDataSymbol: number;
}

/** How a noise level is given. */
export type NoiseLevel = { readonly snrDb: number } | { readonly esN0Db: number } | { readonly ebN0Db: number };

/** The three equivalent figures of one noise variance. */
export interface NoiseFigures {
  readonly noiseVariance: number;
  readonly snrDb: number;
  readonly esN0Db: number;
  readonly ebN0Db: number;
}

/** Es/N0 in dB from Eb/N0: Es/N0 = Eb/N0 + 10·log10(bits per symbol). */
export function esN0DbFromEbN0Db(ebN0Db: number, bitsPerDataSymbol: number): number {
  return ebN0Db + 10 * Math.log10(bitsPerDataSymbol);
}

/** SNR over f_s from Es/N0: SNR = Es/N0 · P_s / (N·E_RE). */
export function snrDbFromEsN0Db(esN0Db: number, ref: NoiseReference): number {
  return esN0Db + 10 * Math.log10(ref.signalPowerLinear / (ref.ifftSize * ref.dataReEnergyLinear));
}

/**
 * Resolves a noise level into the complex noise variance σ² = E|n|² per sample, and all three figures.
 * @throws DspError INVALID_CONFIG for a non-finite level or a reference with no signal or data energy
 */
export function resolveNoiseLevel(level: NoiseLevel, ref: NoiseReference): NoiseFigures {
  if (!(ref.signalPowerLinear > 0) || !(ref.dataReEnergyLinear > 0) || !(ref.bitsPerDataSymbol > 0)) {
    throw new DspError('INVALID_CONFIG', 'The waveform has no data energy: a noise level cannot be set relative to it.');
  }
  const value = 'snrDb' in level ? level.snrDb : 'esN0Db' in level ? level.esN0Db : level.ebN0Db;
  if (!Number.isFinite(value)) throw new DspError('INVALID_CONFIG', `Noise level ${value} dB is not a finite number.`);
  const toSnr = 10 * Math.log10(ref.signalPowerLinear / (ref.ifftSize * ref.dataReEnergyLinear));
  const toEs = 10 * Math.log10(ref.bitsPerDataSymbol);
  let esN0Db: number;
  if ('snrDb' in level) esN0Db = level.snrDb - toSnr;
  else if ('esN0Db' in level) esN0Db = level.esN0Db;
  else esN0Db = level.ebN0Db + toEs;
  const snrDb = esN0Db + toSnr;
  return { noiseVariance: ref.signalPowerLinear / 10 ** (snrDb / 10), snrDb, esN0Db, ebN0Db: esN0Db - toEs };
}
