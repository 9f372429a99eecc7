import { DspError } from '../errors';

/**
 * Joint ML estimation of symbol timing and fractional carrier frequency offset from the cyclic prefix:
 * J.-J. van de Beek, M. Sandell, P. O. Börjesson, "ML estimation of time and frequency offset in OFDM systems",
 * IEEE Trans. Signal Process. 45(7):1800–1805, July 1997 (from memory — verify pages). Per symbol l starting at
 * s_l + θ, with CP length L_l and useful length N:
 *   γ_l(θ) = Σ_{k=0}^{L_l−1} r[s_l+θ+k]·r*[s_l+θ+k+N],   Φ_l(θ) = ½ Σ_k (|r[s_l+θ+k]|² + |r[s_l+θ+k+N]|²),
 * and, summing over the known symbol layout (an extension to many symbols of the paper's single-symbol metric),
 *   θ̂ = argmax_θ { |Σ_l γ_l(θ)| − ρ Σ_l Φ_l(θ) },   ε̂ = −(1/2π)·∠Σ_l γ_l(θ̂),   ρ = SNR/(SNR + 1),
 * ε in subcarrier spacings (|ε| < 1/2). The LTE uplink's half-subcarrier shift makes each CP the negated copy of the
 * symbol tail (e^{jπN/N} = −1), which `cpSign` = −1 undoes.
 */
export interface CpSyncInput {
  /** Start sample and CP length of every symbol, relative to the waveform's first sample. */
  readonly symbols: readonly { readonly startSample: number; readonly cpLengthSamples: number }[];
  /** Useful symbol length N (IFFT size at the record's rate). */
  readonly fftSize: number;
  /** +1, or −1 for the LTE uplink (CP = −tail). */
  readonly cpSign: 1 | -1;
  /** Timing candidates θ = 0…maxOffsetSamples: the waveform may start up to this many samples into the record. */
  readonly maxOffsetSamples: number;
  /** SNR assumed in ρ (dB); default 20. */
  readonly snrDb?: number;
}

export interface CpSyncResult {
  /** θ̂: samples from the record start to the waveform's first CP sample. */
  readonly timingOffsetSamples: number;
  /** ε̂, in subcarrier spacings. */
  readonly cfoSubcarriers: number;
  /** Symbols that entered the metric. */
  readonly numSymbolsUsed: number;
  /** |Σγ| / ΣΦ at θ̂: 1 for a noiseless CP, near 0 for noise. */
  readonly correlationQuality: number;
}

/** Estimates θ̂ and ε̂ from `rxIq`. @throws DspError INVALID_FILE when the record holds no complete symbol. */
export function estimateCpTimingAndCfo(rxIq: Float64Array, input: CpSyncInput): CpSyncResult {
  const numSamples = rxIq.length / 2;
  const n = input.fftSize;
  const maxOffset = Math.max(0, Math.floor(input.maxOffsetSamples));
  const used = input.symbols.filter((s) => s.startSample + maxOffset + s.cpLengthSamples + n <= numSamples);
  if (used.length === 0) {
    throw new DspError('INVALID_FILE', `The record (${numSamples} samples) is too short to hold one whole OFDM symbol of ${n} samples plus its cyclic prefix.`);
  }
  // Prefix sums of p[k] = r[k]·r*[k+N] and e[k] = |r[k]|² + |r[k+N]|², so each γ_l and Φ_l costs O(1).
  const span = numSamples - n;
  const pRe = new Float64Array(span + 1);
  const pIm = new Float64Array(span + 1);
  const e = new Float64Array(span + 1);
  for (let k = 0; k < span; k++) {
    const aRe = rxIq[2 * k]!;
    const aIm = rxIq[2 * k + 1]!;
    const bRe = rxIq[2 * (k + n)]!;
    const bIm = rxIq[2 * (k + n) + 1]!;
    pRe[k + 1] = pRe[k]! + aRe * bRe + aIm * bIm;
    pIm[k + 1] = pIm[k]! + aIm * bRe - aRe * bIm;
    e[k + 1] = e[k]! + aRe * aRe + aIm * aIm + bRe * bRe + bIm * bIm;
  }
  const snr = 10 ** ((input.snrDb ?? 20) / 10);
  const rho = snr / (snr + 1);
  let best = -Infinity;
  let bestTheta = 0;
  let bestRe = 0;
  let bestIm = 0;
  let bestPhi = 0;
  for (let theta = 0; theta <= maxOffset; theta++) {
    let gRe = 0;
    let gIm = 0;
    let phi = 0;
    for (const s of used) {
      const a = s.startSample + theta;
      const b = a + s.cpLengthSamples;
      gRe += pRe[b]! - pRe[a]!;
      gIm += pIm[b]! - pIm[a]!;
      phi += 0.5 * (e[b]! - e[a]!);
    }
    const metric = Math.hypot(gRe, gIm) - rho * phi;
    // Ties (to rounding) go to the earliest candidate.
    if (metric > best + 1e-12 * phi) {
      best = metric;
      bestTheta = theta;
      bestRe = input.cpSign * gRe;
      bestIm = input.cpSign * gIm;
      bestPhi = phi;
    }
  }
  return {
    timingOffsetSamples: bestTheta,
    cfoSubcarriers: -Math.atan2(bestIm, bestRe) / (2 * Math.PI),
    numSymbolsUsed: used.length,
    correlationQuality: bestPhi > 0 ? Math.hypot(bestRe, bestIm) / bestPhi : 0,
  };
}
