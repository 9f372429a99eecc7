import { createRng, deriveBlockSeed } from '../data/rng';
import { assertLength, DspError } from '../errors';
import { DELAY_PROFILES, normalisedTapPowers, type DelayProfileName } from './delayProfiles';
import { applyFractionalDelay, designFractionalDelay, fractionalDelayResponse, type FractionalDelayFilter } from './fractionalDelay';
import { createSosFading, fillSosFading, type SosFading } from './sumOfSinusoids';

/**
 * Tapped-delay-line fading channel: y[n] = Σ_p √P_p·g_p(t_n)·(h_p ∗ x)[n], with the TS 36.101 Annex B.2 delay profiles
 * (powers normalised to Σ P_p = 1), h_p the band-limited interpolator of tap p's exact delay (fractionalDelay.ts), and
 * g_p an independent unit-power Rayleigh process with the classical Doppler spectrum (sumOfSinusoids.ts), evaluated at
 * the output sample time t_n = t_0 + n/f_s. Each tap's process is seeded by deriveBlockSeed(seed, tap index), so a run
 * is reproducible and taps are independent.
 */
export interface MultipathChannelConfig {
  readonly profile: DelayProfileName;
  readonly dopplerHz: number;
  readonly sampleRateHz: number;
  readonly seed: number;
  /** Sinusoids per tap (default 20). */
  readonly numSinusoids?: number;
}

/** One tap: its exact delay, its share of the power, its delay interpolator and its fading process. */
export interface ChannelTap {
  readonly delayS: number;
  readonly powerLinear: number;
  readonly filter: FractionalDelayFilter;
  readonly fading: SosFading;
}

/** A channel realisation (plain data: taps and their seeded fading parameters). */
export interface MultipathChannel {
  readonly profile: DelayProfileName;
  readonly dopplerHz: number;
  readonly sampleRateHz: number;
  readonly taps: readonly ChannelTap[];
}

/**
 * Draws a channel realisation.
 * @throws DspError INVALID_CONFIG for an unknown profile, a non-positive sample rate or a negative Doppler
 */
export function createMultipathChannel(config: MultipathChannelConfig): MultipathChannel {
  const profile = DELAY_PROFILES[config.profile];
  if (!profile) {
    throw new DspError('INVALID_CONFIG', `Channel profile "${String(config.profile)}" is unknown; allowed: epa, eva, etu (TS 36.101 Annex B.2).`);
  }
  if (!(config.sampleRateHz > 0)) throw new DspError('INVALID_CONFIG', `Sample rate ${config.sampleRateHz} Hz must be positive.`);
  const powers = normalisedTapPowers(profile);
  const taps = profile.delaysNs.map((delayNs, p): ChannelTap => {
    const rng = createRng(deriveBlockSeed(config.seed, p));
    return {
      delayS: delayNs * 1e-9,
      powerLinear: powers[p]!,
      filter: designFractionalDelay(delayNs * 1e-9 * config.sampleRateHz),
      fading: createSosFading(config.dopplerHz, config.numSinusoids ?? 20, rng),
    };
  });
  return { profile: config.profile, dopplerHz: config.dopplerHz, sampleRateHz: config.sampleRateHz, taps };
}

/**
 * Passes `inIq` through the channel; the output has the input's length (the delay tail past the end is cut).
 * @param startTimeS time of sample 0 (continues the fading across calls)
 * @param tapGainsOut optional: receives g_p(t_n)·√P_p for every tap p (2·numSamples values each), for ideal-channel receivers
 */
export function applyMultipathChannel(
  channel: MultipathChannel,
  inIq: Float64Array,
  startTimeS: number,
  outIq: Float64Array,
  tapGainsOut?: Float64Array[],
): Float64Array {
  assertLength(outIq, inIq.length, 'Channel output');
  const numSamples = inIq.length / 2;
  outIq.fill(0);
  const gains = new Float64Array(inIq.length);
  const delayedIq = new Float64Array(inIq.length);
  channel.taps.forEach((tap, p) => {
    fillSosFading(tap.fading, startTimeS, channel.sampleRateHz, gains);
    const amp = Math.sqrt(tap.powerLinear);
    applyFractionalDelay(tap.filter, inIq, delayedIq);
    for (let n = 0; n < numSamples; n++) {
      const re = delayedIq[2 * n]!;
      const im = delayedIq[2 * n + 1]!;
      const gRe = amp * gains[2 * n]!;
      const gIm = amp * gains[2 * n + 1]!;
      outIq[2 * n] = outIq[2 * n]! + re * gRe - im * gIm;
      outIq[2 * n + 1] = outIq[2 * n + 1]! + re * gIm + im * gRe;
    }
    if (tapGainsOut) {
      const g = new Float64Array(inIq.length);
      for (let i = 0; i < g.length; i++) g[i] = amp * gains[i]!;
      tapGainsOut[p] = g;
    }
  });
  return outIq;
}

/**
 * Per-tap frequency responses R_p(f) of the delay interpolators at `frequenciesHz` (relative to the carrier), so the
 * channel response over a stretch where the gains are ḡ_p is H(f) = Σ_p ḡ_p·R_p(f).
 * @returns one interleaved array (2·frequencies values) per tap
 */
export function tapFrequencyResponses(channel: MultipathChannel, frequenciesHz: ArrayLike<number>): Float64Array[] {
  return channel.taps.map((tap) => {
    const r = new Float64Array(2 * frequenciesHz.length);
    for (let k = 0; k < frequenciesHz.length; k++) {
      const [re, im] = fractionalDelayResponse(tap.filter, frequenciesHz[k]!, channel.sampleRateHz);
      r[2 * k] = re;
      r[2 * k + 1] = im;
    }
    return r;
  });
}
