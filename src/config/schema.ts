import { z } from 'zod';
import { MODULATIONS } from '../dsp/modulation/constellations';
import { amplifierSchema, impairmentsSchema, paprReductionSchema, spectrumShapingSchema, windowingSchema } from './transmitterSchema';

/**
 * The one description of a waveform, shared by the CLI, the worker and the UI. `parseWaveformConfig` (configParse.ts)
 * applies it, then checks what depends on several fields (numerology, allocations, DFT sizes).
 */
const modulationSchema = z.enum(MODULATIONS, {
  error: `must be one of ${MODULATIONS.join(', ')}`,
});

export const allocationBlockSchema = z
  .object({
    startRb: z.number({ error: 'must be a whole number of resource blocks ≥ 0' }).int().min(0),
    numRb: z.number({ error: 'must be a whole number of resource blocks ≥ 1' }).int().min(1),
    /** Overrides the configuration's modulation for this block. */
    modulation: modulationSchema.optional(),
    /** Power of this block relative to the others, dB (−40…+20). */
    powerOffsetDb: z.number().min(-40).max(20).default(0),
  })
  .strict();

const dataSchema = z.discriminatedUnion(
  'source',
  [
    z.object({ source: z.literal('pn9') }).strict(),
    z.object({ source: z.literal('pn15') }).strict(),
    z.object({ source: z.literal('pn23') }).strict(),
    z.object({ source: z.literal('random'), seed: z.number().int().min(0).max(Number.MAX_SAFE_INTEGER) }).strict(),
    z.object({ source: z.literal('bits'), hex: z.string().regex(/^(0x)?[0-9a-fA-F_\s]+$/, 'must be hexadecimal digits') }).strict(),
  ],
  { error: 'source must be one of pn9, pn15, pn23, random (with seed), bits (with hex)' },
);

const customSchema = z
  .object({
    fftSize: z.number().int().min(16).max(65536),
    numRb: z.number().int().min(1),
    cpLengthSamples: z.number().int().min(0),
  })
  .strict();

/**
 * Reference signals (off unless `enabled`). Which signal is generated follows from standard, link and waveform:
 * LTE uplink PUSCH DMRS (TS 36.211 §5.5.2.1), LTE downlink CRS port 0 (§6.10.1), NR PUSCH DMRS (TS 38.211 §6.4.1.1),
 * low-PAPR type 1 with transform precoding, Gold-sequence type 1 without. Group and sequence hopping are off.
 */
export const referenceSignalsSchema = z
  .object({
    enabled: z.boolean({ error: 'must be true or false' }).default(false),
    /** Sequence-group number u (0…29): LTE PUSCH DMRS and NR transform-precoded DMRS. */
    groupNumber: z.number({ error: 'must be a whole number from 0 to 29' }).int().min(0).max(29).default(0),
    /** Base-sequence number v within the group (0 or 1); used only for sequences of 72 or more elements. */
    sequenceNumber: z.number({ error: 'must be 0 or 1' }).int().min(0).max(1).default(0),
    /** LTE PUSCH DMRS cyclic shift n_cs (0…11): α = 2π·n_cs/12, the same in every slot. */
    cyclicShift: z.number({ error: 'must be a whole number from 0 to 11' }).int().min(0).max(11).default(0),
    /** LTE downlink CRS: physical cell identity N_ID^cell (0…503). */
    cellId: z.number({ error: 'must be a whole number from 0 to 503' }).int().min(0).max(503).default(0),
    /** NR CP-OFDM DMRS: scrambling identity N_ID (0…65535). */
    scramblingId: z.number({ error: 'must be a whole number from 0 to 65535' }).int().min(0).max(65535).default(0),
    /** NR CP-OFDM DMRS: n_SCID (0 or 1). */
    nScid: z.number({ error: 'must be 0 or 1' }).int().min(0).max(1).default(0),
    /** NR: single-symbol DMRS positions within each slot (symbol indices, ascending); default 2, 7, 11. */
    dmrsSymbols: z
      .array(z.number({ error: 'must be symbol indices 0…13' }).int().min(0).max(13))
      .min(1, 'must list at least one symbol')
      .max(4, 'may list at most 4 symbols')
      .optional(),
  })
  .strict();

/** Largest number of OFDM symbols one configuration may describe (10 s of LTE normal CP). */
export const MAX_SYMBOLS = 140000;

export const waveformConfigSchema = z
  .object({
    standard: z.enum(['lte', 'nr', 'custom'], { error: 'must be "lte", "nr" or "custom"' }).default('lte'),
    link: z.enum(['uplink', 'downlink'], { error: 'must be "uplink" or "downlink"' }).default('uplink'),
    bandwidthMHz: z.number({ error: 'must be a channel bandwidth in MHz' }).positive().default(20),
    /** NR only: 15, 30 or 60 (default 30). LTE is always 15 kHz. Custom: any positive spacing (default 15). */
    subcarrierSpacingKHz: z.number().positive().optional(),
    cyclicPrefix: z.enum(['normal', 'extended'], { error: 'must be "normal" or "extended"' }).default('normal'),
    /** Default: "dft-s-ofdm" on the uplink, "ofdm" on the downlink. */
    waveform: z.enum(['ofdm', 'dft-s-ofdm'], { error: 'must be "ofdm" or "dft-s-ofdm"' }).optional(),
    mapping: z.enum(['localized', 'interleaved'], { error: 'must be "localized" or "interleaved"' }).default('localized'),
    /** Interleaved mapping: data on every Q-th subcarrier of each block (2…64). Not a 3GPP PUSCH mode. */
    interleaveFactor: z.number().int().min(2).max(64).default(2),
    /** Interleaved mapping: which subcarrier of each group of Q carries data (0…Q−1). */
    combOffset: z.number().int().min(0).default(0),
    /** One block or a list; default the whole grid. */
    allocation: z.union([allocationBlockSchema, z.array(allocationBlockSchema).min(1)]).optional(),
    modulation: modulationSchema.default('qpsk'),
    data: dataSchema.default({ source: 'pn9' }),
    symbols: z.number().int().min(1).max(MAX_SYMBOLS).default(14),
    oversampling: z.number({ error: 'must be a whole number from 1 to 16' }).int().min(1).max(16).default(1),
    /** Carrier frequency f0 in Hz: NR applies the §5.4 phase term; recorded in file metadata. */
    carrierFrequencyHz: z.number().positive().max(300e9).optional(),
    /** Reference signals; absent means off (data-only waveform). */
    referenceSignals: referenceSignalsSchema.optional(),
    /** Research numerology for standard "custom". */
    custom: customSchema.optional(),
    /** Transmitter sub-objects (transmitterSchema.ts); each is off when absent. */
    spectrumShaping: spectrumShapingSchema.optional(),
    windowing: windowingSchema.optional(),
    paprReduction: paprReductionSchema.optional(),
    impairments: impairmentsSchema.optional(),
    amplifier: amplifierSchema.optional(),
  })
  .strict();

/** A configuration as written by a user (every field optional). */
export type WaveformConfigInput = z.input<typeof waveformConfigSchema>;
/** A validated configuration with defaults applied. */
export type WaveformConfig = z.output<typeof waveformConfigSchema>;
export type ReferenceSignalsConfig = z.output<typeof referenceSignalsSchema>;
export type AllocationBlockInput = z.input<typeof allocationBlockSchema>;
