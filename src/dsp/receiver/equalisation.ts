import { createFftPlan, ifftUnitary, type FftPlan } from '../fft/fftPlan';

/**
 * One-tap equalisation of the data elements of one allocation block in one symbol, Y_k = G_k·x_k + n_k with
 * G_k = Ĥ_k·(block amplitude) and E|x_k|² = 1 (common practice; Proakis ch. 9 / van Nee & Prasad ch. 5 for the forms):
 * - ZF:   x̂_k = Y_k / G_k. Post-equaliser noise σ²/|G_k|² per element; after DFT de-spreading σ²·mean_k(1/|G_k|²).
 * - MMSE: x̂_k = G_k*·Y_k / (|G_k|² + σ²). For OFDM the unbiased per-element MMSE estimate equals ZF, so MMSE changes
 *   nothing there. For DFT-s-OFDM the de-spread block is divided by μ = mean_k |G_k|²/(|G_k|² + σ²) to remove the bias,
 *   leaving noise-plus-interference variance (1 − μ)/μ per symbol.
 * DFT-s-OFDM blocks are then de-spread by the unitary IDFT (inverse of TS 36.211 §5.3.3 / TS 38.211 §6.3.1.4).
 */
/** Zero forcing or (unbiased) MMSE. */
export type EqualizerKind = 'zf' | 'mmse';

const idftPlans = new Map<number, FftPlan>();

/**
 * Equalises (and for DFT-s-OFDM de-spreads) one block of one symbol.
 * @param rxIq Y_k of the block's data elements in order (2M values)
 * @param gainIq G_k (2M values)
 * @param noiseVariance σ² per element (used by MMSE; NaN falls back to ZF)
 * @param despread true for DFT-s-OFDM
 * @param outSymbolsIq 2M values: x̂ (OFDM) or the de-spread symbols (DFT-s-OFDM)
 * @param outFreqIq 2M values: equalised frequency-domain values (for per-subcarrier EVM)
 * @param outNoiseVariance M values: post-equaliser noise variance of each output symbol
 */
export function equaliseBlock(
  kind: EqualizerKind,
  rxIq: Float64Array,
  gainIq: Float64Array,
  noiseVariance: number,
  despread: boolean,
  outSymbolsIq: Float64Array,
  outFreqIq: Float64Array,
  outNoiseVariance: Float64Array,
): void {
  const m = rxIq.length / 2;
  const mmse = kind === 'mmse' && despread && Number.isFinite(noiseVariance);
  const sigma2 = Number.isFinite(noiseVariance) ? noiseVariance : Number.NaN;
  let sumInvGain = 0;
  let sumMu = 0;
  for (let k = 0; k < m; k++) {
    const gRe = gainIq[2 * k]!;
    const gIm = gainIq[2 * k + 1]!;
    const g2 = gRe * gRe + gIm * gIm;
    const yRe = rxIq[2 * k]!;
    const yIm = rxIq[2 * k + 1]!;
    // ZF value (also the unbiased MMSE value per element).
    const zRe = (yRe * gRe + yIm * gIm) / g2;
    const zIm = (yIm * gRe - yRe * gIm) / g2;
    outFreqIq[2 * k] = zRe;
    outFreqIq[2 * k + 1] = zIm;
    sumInvGain += 1 / g2;
    if (mmse) {
      const w = g2 / (g2 + sigma2);
      sumMu += w;
      outSymbolsIq[2 * k] = w * zRe;
      outSymbolsIq[2 * k + 1] = w * zIm;
    } else {
      outSymbolsIq[2 * k] = zRe;
      outSymbolsIq[2 * k + 1] = zIm;
      outNoiseVariance[k] = sigma2 / g2;
    }
  }
  if (!despread) return;
  let plan = idftPlans.get(m);
  if (!plan) {
    plan = createFftPlan(m);
    idftPlans.set(m, plan);
  }
  const spread = outSymbolsIq.slice();
  ifftUnitary(plan, spread, outSymbolsIq);
  if (mmse) {
    const mu = sumMu / m;
    for (let i = 0; i < outSymbolsIq.length; i++) outSymbolsIq[i] = outSymbolsIq[i]! / mu;
    outNoiseVariance.fill((1 - mu) / mu);
  } else {
    outNoiseVariance.fill((sigma2 * sumInvGain) / m);
  }
}
