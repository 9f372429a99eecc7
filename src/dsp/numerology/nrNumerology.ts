/**
 * NR FR1 numerology (TS 38.211 §4.2, §4.3, §5.3.1; TS 38.101-1 Table 5.3.2-1).
 * Tc = 1/(Δf_max·N_f), Δf_max = 480 kHz, N_f = 4096; κ = Ts/Tc = 64.
 * N_u = 2048κ·2^−μ; normal CP 144κ·2^−μ, plus 16κ on l = 0 and l = 7·2^μ of each subframe; extended CP 512κ·2^−μ (μ = 2 only).
 */
import { twoPow } from '../math/float64Bits';
/** 1/Tc = Δf_max·N_f, Tc per second (TS 38.211 §4.1). */
export const NR_TC_PER_SECOND = 480000 * 4096;
/** κ = Ts/Tc (TS 38.211 §4.1). */
export const NR_KAPPA = 64;

/** Maximum transmission bandwidth N_RB, FR1 (TS 38.101-1 Table 5.3.2-1), by SCS in kHz, then channel BW in MHz. */
export const NR_FR1_NUM_RB: Readonly<Record<number, Readonly<Record<number, number>>>> = {
  15: { 3: 15, 5: 25, 10: 52, 15: 79, 20: 106, 25: 133, 30: 160, 35: 188, 40: 216, 45: 242, 50: 270 },
  30: { 5: 11, 10: 24, 15: 38, 20: 51, 25: 65, 30: 78, 35: 92, 40: 106, 45: 119, 50: 133, 60: 162, 70: 189, 80: 217, 90: 245, 100: 273 },
  60: { 10: 11, 15: 18, 20: 24, 25: 31, 30: 38, 40: 51, 50: 65, 60: 79, 80: 107, 100: 135 },
};

/** μ for a subcarrier spacing of 15·2^μ kHz (FR1 data: μ = 0, 1, 2). */
export function nrMu(subcarrierSpacingKHz: number): number {
  return Math.round(Math.log2(subcarrierSpacingKHz / 15));
}

/**
 * FFT size for an NR carrier (common practice; 3GPP leaves it to the implementer): the smallest power of two
 * whose sample rate N·Δf covers the channel bandwidth and whose grid occupancy 12·N_RB/N is at most 85 %.
 * This gives 4096 at 122.88 Msps for 100 MHz at 30 kHz and 2048 at 30.72 Msps for 20 MHz at 15 kHz, and the
 * same rule reproduces the LTE sizes 128…2048 of TS 36.101's bandwidths.
 */
export function nrFftSize(numRb: number, subcarrierSpacingHz: number, bandwidthHz: number): number {
  let n = 128;
  while (n * subcarrierSpacingHz < bandwidthHz || 12 * numRb > 0.85 * n) n *= 2;
  return n;
}

/**
 * CP lengths in samples over one half subframe (7·2^μ symbols normal, 6·2^μ extended), at `fftSize`.
 * Samples = Tc count × f_s·Tc with f_s = fftSize·Δf.
 */
export function nrCpPatternSamples(mu: number, cyclicPrefix: 'normal' | 'extended', fftSize: number): number[] {
  const scs = 15000 * twoPow(mu);
  const samplesPerTc = (fftSize * scs) / NR_TC_PER_SECOND;
  const period = (cyclicPrefix === 'extended' ? 6 : 7) * twoPow(mu);
  return Array.from({ length: period }, (_, l) => {
    const tc =
      cyclicPrefix === 'extended'
        ? 512 * NR_KAPPA * twoPow(-mu)
        : 144 * NR_KAPPA * twoPow(-mu) + (l === 0 ? 16 * NR_KAPPA : 0);
    return tc * samplesPerTc;
  });
}
