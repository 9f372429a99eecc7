/**
 * Multipath delay profiles of TS 36.101 Annex B.2.1 (Table B.2.1-2 EPA, B.2.1-3 EVA, B.2.1-4 ETU; also TS 36.104 Annex B.2):
 * excess tap delays in ns and relative powers in dB. The r.m.s. delay spreads the annex lists (43, 357, 991 ns,
 * Table B.2.1-1) follow from these taps (`rmsDelaySpreadS`), which supports the values. Delays and powers of EPA and
 * EVA and delays of ETU are [S2, several public implementations]; ETU powers (from memory — verify), backed by the
 * 990.9 ns they give. Each tap fades as independent Rayleigh with the classical Doppler spectrum (Annex B.2.1).
 */
export type DelayProfileName = 'epa' | 'eva' | 'etu';

/** One profile of Annex B.2.1. */
export interface DelayProfile {
  readonly name: DelayProfileName;
  readonly delaysNs: readonly number[];
  readonly powersDb: readonly number[];
  /** The Doppler frequency TS 36.101 Table B.2.1-5 pairs with it by default here: EPA 5 Hz, EVA 70 Hz, ETU 300 Hz. */
  readonly defaultDopplerHz: number;
}

/** The three profiles, by name. */
export const DELAY_PROFILES: Readonly<Record<DelayProfileName, DelayProfile>> = {
  epa: {
    name: 'epa',
    delaysNs: [0, 30, 70, 90, 110, 190, 410],
    powersDb: [0.0, -1.0, -2.0, -3.0, -8.0, -17.2, -20.8],
    defaultDopplerHz: 5,
  },
  eva: {
    name: 'eva',
    delaysNs: [0, 30, 150, 310, 370, 710, 1090, 1730, 2510],
    powersDb: [0.0, -1.5, -1.4, -3.6, -0.6, -9.1, -7.0, -12.0, -16.9],
    defaultDopplerHz: 70,
  },
  etu: {
    name: 'etu',
    delaysNs: [0, 50, 120, 200, 230, 500, 1600, 2300, 5000],
    powersDb: [-1.0, -1.0, -1.0, 0.0, 0.0, 0.0, -3.0, -5.0, -7.0],
    defaultDopplerHz: 300,
  },
};

/** Tap powers as linear fractions of the total (Σ = 1), so the channel keeps the mean signal power (common practice). */
export function normalisedTapPowers(profile: DelayProfile): Float64Array {
  const linear = profile.powersDb.map((p) => 10 ** (p / 10));
  const total = linear.reduce((a, b) => a + b, 0);
  return Float64Array.from(linear, (p) => p / total);
}

/** R.m.s. delay spread τ_rms = √(Σp·τ² / Σp − (Σp·τ / Σp)²), seconds. */
export function rmsDelaySpreadS(profile: DelayProfile): number {
  const p = normalisedTapPowers(profile);
  let mean = 0;
  let meanSquare = 0;
  profile.delaysNs.forEach((d, i) => {
    mean += p[i]! * d * 1e-9;
    meanSquare += p[i]! * (d * 1e-9) ** 2;
  });
  return Math.sqrt(meanSquare - mean * mean);
}
