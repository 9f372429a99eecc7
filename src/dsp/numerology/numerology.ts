import { DspError } from '../errors';
import {
  findLteBandwidth,
  LTE_BANDWIDTHS,
  LTE_SUBCARRIER_SPACING_HZ,
  lteCpPatternSamples,
} from './lteNumerology';
import { NR_FR1_NUM_RB, nrCpPatternSamples, nrFftSize, nrMu } from './nrNumerology';

/** The parts of a waveform configuration that fix its numerology. */
export interface NumerologyInput {
  readonly standard: 'lte' | 'nr' | 'custom';
  readonly link: 'uplink' | 'downlink';
  readonly bandwidthMHz: number;
  readonly subcarrierSpacingKHz?: number | undefined;
  readonly cyclicPrefix: 'normal' | 'extended';
  readonly custom?: { readonly fftSize: number; readonly numRb: number; readonly cpLengthSamples: number } | undefined;
}

/** Everything about the time-frequency grid, at oversampling 1. Plain data. */
export interface Numerology {
  readonly standard: 'lte' | 'nr' | 'custom';
  readonly link: 'uplink' | 'downlink';
  readonly subcarrierSpacingHz: number;
  readonly fftSize: number;
  /** fftSize · Δf. */
  readonly sampleRateHz: number;
  readonly numRb: number;
  /** 12 · N_RB. */
  readonly numGridSubcarriers: number;
  readonly channelBandwidthHz: number;
  /** N_RB · 12 · Δf (TS 36.101 §5.6: N_RB × 180 kHz for LTE). */
  readonly transmissionBandwidthHz: number;
  /** OFDM symbols in one slot: LTE 7/6 per 0.5 ms; NR 14/12. */
  readonly symbolsPerSlot: number;
  /** CP lengths in samples; symbol l uses cpPatternSamples[l mod length] (period: one LTE slot, one NR half subframe). */
  readonly cpPatternSamples: readonly number[];
  /** LTE downlink: the DC subcarrier is not transmitted (TS 36.211 §6.12). */
  readonly dcNull: boolean;
  /** LTE uplink: every subcarrier sits at (k + 1/2)Δf (TS 36.211 §5.6). */
  readonly halfSubcarrierShift: boolean;
  /** Samples in one slot at oversampling 1. */
  readonly slotLengthSamples: number;
}

/** Resolves and validates the numerology of a configuration; errors name the field and the allowed values. */
export function resolveNumerology(input: NumerologyInput): Numerology {
  switch (input.standard) {
    case 'lte':
      return lteNumerology(input);
    case 'nr':
      return nrNumerology(input);
    case 'custom':
      return customNumerology(input);
  }
}

function lteNumerology(input: NumerologyInput): Numerology {
  const row = findLteBandwidth(input.bandwidthMHz);
  if (!row) {
    throw new DspError(
      'INVALID_CONFIG',
      `bandwidthMHz ${input.bandwidthMHz} is not an LTE channel bandwidth; allowed: ${LTE_BANDWIDTHS.map((r) => r.bandwidthMHz).join(', ')} (TS 36.101 Table 5.6-1).`,
      { field: 'bandwidthMHz' },
    );
  }
  if (input.subcarrierSpacingKHz !== undefined && input.subcarrierSpacingKHz !== 15) {
    throw new DspError('INVALID_CONFIG', `subcarrierSpacingKHz ${input.subcarrierSpacingKHz} is not used by LTE: its spacing is 15 kHz (omit the field).`, {
      field: 'subcarrierSpacingKHz',
    });
  }
  const cp = lteCpPatternSamples(input.cyclicPrefix, row.fftSize);
  return finish(input, LTE_SUBCARRIER_SPACING_HZ, row.fftSize, row.numRb, input.bandwidthMHz * 1e6, cp, cp.length, {
    dcNull: input.link === 'downlink',
    halfSubcarrierShift: input.link === 'uplink',
  });
}

function nrNumerology(input: NumerologyInput): Numerology {
  const scsKHz = input.subcarrierSpacingKHz ?? 30;
  const table = NR_FR1_NUM_RB[scsKHz];
  if (!table) {
    throw new DspError('INVALID_CONFIG', `subcarrierSpacingKHz ${scsKHz} is not an NR FR1 data numerology; allowed: 15, 30, 60 (TS 38.211 Table 4.2-1).`, {
      field: 'subcarrierSpacingKHz',
    });
  }
  const numRb = table[input.bandwidthMHz];
  if (numRb === undefined) {
    throw new DspError(
      'INVALID_CONFIG',
      `bandwidthMHz ${input.bandwidthMHz} has no N_RB at ${scsKHz} kHz in TS 38.101-1 Table 5.3.2-1; allowed: ${Object.keys(table).join(', ')}.`,
      { field: 'bandwidthMHz' },
    );
  }
  const mu = nrMu(scsKHz);
  if (input.cyclicPrefix === 'extended' && mu !== 2) {
    throw new DspError('INVALID_CONFIG', `cyclicPrefix "extended" exists only at 60 kHz in NR (TS 38.211 Table 4.2-1); got ${scsKHz} kHz.`, {
      field: 'cyclicPrefix',
    });
  }
  const scsHz = scsKHz * 1000;
  const fftSize = nrFftSize(numRb, scsHz, input.bandwidthMHz * 1e6);
  const cp = nrCpPatternSamples(mu, input.cyclicPrefix, fftSize);
  if (cp.some((c) => !Number.isInteger(c))) {
    throw new DspError('UNSUPPORTED_SIZE', `NR ${input.bandwidthMHz} MHz at ${scsKHz} kHz gives a non-integer CP at FFT ${fftSize}.`);
  }
  const symbolsPerSlot = input.cyclicPrefix === 'extended' ? 12 : 14;
  return finish(input, scsHz, fftSize, numRb, input.bandwidthMHz * 1e6, cp, symbolsPerSlot, {
    dcNull: false,
    halfSubcarrierShift: false,
  });
}

function customNumerology(input: NumerologyInput): Numerology {
  const custom = input.custom;
  if (!custom) {
    throw new DspError('INVALID_CONFIG', 'custom: standard "custom" needs custom.fftSize, custom.numRb and custom.cpLengthSamples.', {
      field: 'custom',
    });
  }
  if (12 * custom.numRb > custom.fftSize) {
    throw new DspError('INVALID_CONFIG', `custom.numRb ${custom.numRb} needs ${12 * custom.numRb} subcarriers, more than custom.fftSize ${custom.fftSize}.`, {
      field: 'custom.numRb',
    });
  }
  if (custom.cpLengthSamples >= custom.fftSize) {
    throw new DspError('INVALID_CONFIG', `custom.cpLengthSamples (${custom.cpLengthSamples} samples) must be shorter than the FFT size (${custom.fftSize}).`, {
      field: 'custom.cpLengthSamples',
    });
  }
  const scsHz = (input.subcarrierSpacingKHz ?? 15) * 1000;
  return finish(input, scsHz, custom.fftSize, custom.numRb, custom.fftSize * scsHz, [custom.cpLengthSamples], 14, {
    dcNull: false,
    halfSubcarrierShift: false,
  });
}

function finish(
  input: NumerologyInput,
  subcarrierSpacingHz: number,
  fftSize: number,
  numRb: number,
  channelBandwidthHz: number,
  cpPatternSamples: number[],
  symbolsPerSlot: number,
  flags: { dcNull: boolean; halfSubcarrierShift: boolean },
): Numerology {
  let slotLengthSamples = 0;
  for (let l = 0; l < symbolsPerSlot; l++) slotLengthSamples += fftSize + cpPatternSamples[l % cpPatternSamples.length]!;
  return {
    standard: input.standard,
    link: input.link,
    subcarrierSpacingHz,
    fftSize,
    sampleRateHz: fftSize * subcarrierSpacingHz,
    numRb,
    numGridSubcarriers: 12 * numRb,
    channelBandwidthHz,
    transmissionBandwidthHz: 12 * numRb * subcarrierSpacingHz,
    symbolsPerSlot,
    cpPatternSamples,
    slotLengthSamples,
    ...flags,
  };
}

/** CP length in samples (oversampling 1) of OFDM symbol `symbolIndex`, counted from the first symbol of slot 0. */
export function cpLengthSamplesOf(numerology: Numerology, symbolIndex: number): number {
  const p = numerology.cpPatternSamples;
  return p[symbolIndex % p.length]!;
}
