/**
 * LTE (E-UTRA) numerology, Δf = 15 kHz.
 * - N_RB per channel bandwidth: TS 36.101 Table 5.6-1.
 * - Cyclic prefix in Ts = 1/(15000·2048) s: normal 160 (l = 0) / 144 (l = 1…6), extended 512, per 0.5 ms slot
 *   (TS 36.211 Table 5.6-1 uplink, Table 6.12-1 downlink).
 * - FFT size and sample rate are common practice: 3GPP defines only Ts; smaller sizes keep Δf and scale every
 *   length by N_FFT/2048 (TS 36.101 Table F.5.3-1 lists the scaled CPs 9, 18, 36, 72, 108, 144).
 */
export interface LteBandwidthRow {
  readonly bandwidthMHz: number;
  readonly numRb: number;
  readonly fftSize: number;
}

/** Channel bandwidth, N_RB (TS 36.101 Table 5.6-1) and the common-practice FFT size, narrowest first. */
export const LTE_BANDWIDTHS: readonly LteBandwidthRow[] = [
  { bandwidthMHz: 1.4, numRb: 6, fftSize: 128 },
  { bandwidthMHz: 3, numRb: 15, fftSize: 256 },
  { bandwidthMHz: 5, numRb: 25, fftSize: 512 },
  { bandwidthMHz: 10, numRb: 50, fftSize: 1024 },
  { bandwidthMHz: 15, numRb: 75, fftSize: 1536 },
  { bandwidthMHz: 20, numRb: 100, fftSize: 2048 },
];

/** Δf, Hz (Ts = 1/(Δf·2048), TS 36.211 §4). */
export const LTE_SUBCARRIER_SPACING_HZ = 15000;
/** Ts-units in one useful symbol, N = 2048 (TS 36.211 §4). */
export const LTE_USEFUL_TS = 2048;
/** Normal CP in Ts: 160 on l = 0 of each slot, 144 on l = 1…6 (TS 36.211 Tables 5.6-1, 6.12-1). */
export const LTE_NORMAL_CP_TS = { first: 160, other: 144 } as const;
/** Extended CP in Ts, every symbol (same tables). */
export const LTE_EXTENDED_CP_TS = 512;

/** The LTE row for a channel bandwidth, or undefined when 36.101 does not list it. */
export function findLteBandwidth(bandwidthMHz: number): LteBandwidthRow | undefined {
  return LTE_BANDWIDTHS.find((row) => Math.abs(row.bandwidthMHz - bandwidthMHz) < 1e-9);
}

/**
 * Cyclic-prefix lengths in samples at `fftSize` over one 0.5 ms slot: 7 values (normal) or 6 (extended).
 * Scaling Ts lengths by N_FFT/2048 gives whole numbers for every size of Table 5.6-1's bandwidths.
 */
export function lteCpPatternSamples(cyclicPrefix: 'normal' | 'extended', fftSize: number): number[] {
  const scale = fftSize / LTE_USEFUL_TS;
  if (cyclicPrefix === 'extended') return Array.from({ length: 6 }, () => LTE_EXTENDED_CP_TS * scale);
  return Array.from({ length: 7 }, (_, l) => (l === 0 ? LTE_NORMAL_CP_TS.first : LTE_NORMAL_CP_TS.other) * scale);
}
