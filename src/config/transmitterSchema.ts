import { z } from 'zod';

/**
 * Optional transmitter-side sub-objects of the waveform configuration. Each one is off when absent, so a
 * configuration without them generates exactly what it did before. The DSP blocks they drive live in
 * src/dsp/{shaping,paprReduction,impairments,amplifier}; src/dsp/transmitter/transmitterChain.ts applies them.
 */

const drive = {
  /** Which back-off `backoffDb` sets: output (default) or input, relative to saturation. */
  backoffReference: z.enum(['obo', 'ibo'], { error: 'must be "obo" or "ibo"' }).default('obo'),
  /** Back-off from saturation, dB (−10…60). */
  backoffDb: z.number().min(-10).max(60).default(6),
};

const complexPair = z.tuple([z.number(), z.number()], { error: 'must be a pair [re, im]' });

export const amplifierSchema = z.discriminatedUnion(
  'model',
  [
    z
      .object({
        model: z.literal('rapp'),
        /** Smoothness p (0.1…1000). */
        smoothness: z.number().min(0.1).max(1000).default(2),
        gainDb: z.number().min(-60).max(60).default(0),
        /** A_sat, output amplitude (model units). */
        outputSaturationAmplitude: z.number().positive().default(1),
        amPm: z.object({ alphaDeg: z.number(), betaAmplitude: z.number().positive(), exponent: z.number().positive() }).strict().optional(),
        ...drive,
      })
      .strict(),
    z
      .object({
        model: z.literal('saleh'),
        alphaA: z.number().positive().default(2.1587),
        betaA: z.number().positive().default(1.1517),
        alphaPhi: z.number().default(4.0033),
        betaPhi: z.number().min(0).default(9.104),
        ...drive,
      })
      .strict(),
    z
      .object({
        model: z.literal('limiter'),
        gainDb: z.number().min(-60).max(60).default(0),
        outputSaturationAmplitude: z.number().positive().default(1),
        ...drive,
      })
      .strict(),
    z
      .object({
        model: z.literal('polynomial'),
        /** coefficients[m][k−1] = a_{k,m} as [re, im]. */
        coefficients: z.array(z.array(complexPair).min(1)).min(1).max(16),
        maxInputAmplitude: z.number().positive(),
        inputSaturationAmplitude: z.number().positive().optional(),
        ...drive,
      })
      .strict(),
    z
      .object({
        model: z.literal('table'),
        inputUnit: z.enum(['dBm', 'dBFS'], { error: 'must be "dBm" or "dBFS"' }),
        rows: z
          .array(z.object({ inputDb: z.number(), gainDb: z.number(), phaseDeg: z.number() }).strict())
          .min(2, 'needs at least 2 rows'),
        ...drive,
      })
      .strict(),
  ],
  { error: 'model must be one of rapp, saleh, limiter, polynomial, table' },
);

const maskPoint = z.object({ offsetHz: z.number().positive(), levelDbcPerHz: z.number().max(0).min(-250) }).strict();

export const impairmentsSchema = z
  .object({
    /** Seed of the random impairments (phase noise). */
    seed: z.number().int().min(0).max(Number.MAX_SAFE_INTEGER).default(1),
    /** Q-branch gain (dB) and phase (degrees) error of the IQ modulator. */
    iqImbalance: z.object({ gainDb: z.number().min(-6).max(6).default(0), phaseDeg: z.number().min(-45).max(45).default(0) }).strict().optional(),
    /** LO leakage: a constant added to the signal, levelDbc relative to its mean power. */
    dcOffset: z.object({ levelDbc: z.number().min(-120).max(0), phaseDeg: z.number().default(0) }).strict().optional(),
    /** Phase noise: a Wiener process of 3 dB linewidth linewidthHz, and/or a single-sideband mask L(f) in dBc/Hz. */
    phaseNoise: z
      .object({
        linewidthHz: z.number().positive().max(1e8).optional(),
        mask: z.array(maskPoint).min(2, 'needs at least 2 points').optional(),
      })
      .strict()
      .refine((p) => p.linewidthHz !== undefined || p.mask !== undefined, 'give linewidthHz, mask, or both')
      .optional(),
    /** DAC quantisation: bits per rail, and full scale as an amplitude or as headroom above the RMS level. */
    dac: z
      .object({
        bits: z.number().int().min(2).max(24),
        fullScaleAmplitude: z.number().positive().optional(),
        headroomDb: z.number().min(0).max(40).default(12),
      })
      .strict()
      .optional(),
    /** Sample-clock offset of the DAC, parts per million (−1000…1000). */
    sampleClockPpm: z.number().min(-1000).max(1000).optional(),
  })
  .strict();

export const paprReductionSchema = z
  .object({
    method: z.literal('clip-filter').default('clip-filter'),
    /** Clipping level over the RMS amplitude, dB (0…20). */
    clippingRatioDb: z.number().min(0).max(20).default(5),
    iterations: z.number().int().min(1).max(16).default(4),
    /** Which subcarriers survive the filter: only the allocated ones, or the whole grid. */
    filter: z.enum(['allocated', 'grid'], { error: 'must be "allocated" or "grid"' }).default('allocated'),
  })
  .strict();

export const spectrumShapingSchema = z
  .object({
    shape: z.enum(['rrc', 'rc'], { error: 'must be "rrc" or "rc"' }).default('rrc'),
    /** Excess bandwidth β (0…1). */
    rollOff: z.number().min(0).max(1).default(0.25),
    /** Extend the DFT output cyclically over ≈ β·M extra subcarriers (true), or shape inside the allocation (false). */
    extension: z.boolean().default(true),
  })
  .strict();

export const windowingSchema = z
  .object({
    /** Raised-cosine ramp length, samples at the base rate (oversampling 1); ≤ the shortest CP. */
    rampLengthSamples: z.number().int().min(1),
  })
  .strict();

export type AmplifierConfig = z.output<typeof amplifierSchema>;
export type ImpairmentsConfig = z.output<typeof impairmentsSchema>;
export type PaprReductionConfig = z.output<typeof paprReductionSchema>;
export type SpectrumShapingConfig = z.output<typeof spectrumShapingSchema>;
export type WindowingConfig = z.output<typeof windowingSchema>;
