/**
 * The fields of the configuration form. Choices come from the zod schema (the single source of
 * truth) and, for bandwidth suggestions, from the standards' numerology tables; labels are ours.
 */
import { waveformConfigSchema } from '../../config/schema';
import { LTE_BANDWIDTHS } from '../../dsp/numerology/lteNumerology';
import { NR_FR1_NUM_RB } from '../../dsp/numerology/nrNumerology';
import type { ConfigDraft } from '../state/configValidation';

export interface FieldOption {
  value: string | number;
  label: string;
}

interface FieldBase {
  key: string;
  label: string;
  /** Shown under the field. */
  hint?: string;
  visible?: (draft: ConfigDraft) => boolean;
}

export interface SelectField extends FieldBase {
  kind: 'select';
  options: (draft: ConfigDraft) => FieldOption[];
  /** Shown when the draft leaves the field out (the schema's default). */
  defaultValue: (draft: ConfigDraft) => string | number;
}

export interface NumberField extends FieldBase {
  kind: 'number';
  unit?: string;
  step?: number;
  /** Values offered in a datalist; any other value may still be typed. */
  suggestions?: (draft: ConfigDraft) => number[];
  defaultValue: number;
}

export type ConfigField = SelectField | NumberField;

const shape = waveformConfigSchema.shape;

const displayNames: Record<string, string> = {
  lte: 'LTE',
  nr: 'NR',
  uplink: 'Uplink',
  downlink: 'Downlink',
  normal: 'Normal',
  extended: 'Extended',
  ofdm: 'CP-OFDM',
  'dft-s-ofdm': 'DFT-s-OFDM (SC-FDMA)',
  bpsk: 'BPSK',
  'pi/2-bpsk': 'π/2-BPSK',
  qpsk: 'QPSK',
  '16qam': '16QAM',
  '64qam': '64QAM',
  '256qam': '256QAM',
  '1024qam': '1024QAM',
};

export function displayName(value: string): string {
  return displayNames[value] ?? value;
}

const optionsOf = (values: readonly string[]): FieldOption[] => values.map((value) => ({ value, label: displayName(value) }));

/** NR subcarrier spacing when the draft gives none (schema comment: NR default 30 kHz). */
export const NR_DEFAULT_SCS_KHZ = 30;

function bandwidthSuggestions(draft: ConfigDraft): number[] {
  if (draft.standard === 'nr') {
    const scs = typeof draft.subcarrierSpacingKHz === 'number' ? draft.subcarrierSpacingKHz : NR_DEFAULT_SCS_KHZ;
    return Object.keys(NR_FR1_NUM_RB[scs] ?? {}).map(Number);
  }
  return LTE_BANDWIDTHS.map((row) => row.bandwidthMHz);
}

export const configFields: readonly ConfigField[] = [
  {
    kind: 'select',
    key: 'standard',
    label: 'Standard',
    // The research numerology ("custom") needs its own sub-form (issue 7).
    options: () => optionsOf(shape.standard.unwrap().options.filter((value) => value !== 'custom')),
    defaultValue: () => 'lte',
  },
  {
    kind: 'select',
    key: 'link',
    label: 'Link',
    options: () => optionsOf(shape.link.unwrap().options),
    defaultValue: () => 'uplink',
  },
  {
    kind: 'number',
    key: 'bandwidthMHz',
    label: 'Channel bandwidth',
    unit: 'MHz',
    step: 0.1,
    suggestions: bandwidthSuggestions,
    defaultValue: 20,
  },
  {
    kind: 'select',
    key: 'subcarrierSpacingKHz',
    label: 'Subcarrier spacing',
    visible: (draft) => draft.standard === 'nr',
    options: () => Object.keys(NR_FR1_NUM_RB).map((scs) => ({ value: Number(scs), label: `${scs} kHz` })),
    defaultValue: () => NR_DEFAULT_SCS_KHZ,
  },
  {
    kind: 'select',
    key: 'cyclicPrefix',
    label: 'Cyclic prefix',
    options: () => optionsOf(shape.cyclicPrefix.unwrap().options),
    defaultValue: () => 'normal',
  },
  {
    kind: 'select',
    key: 'waveform',
    label: 'Waveform',
    options: () => optionsOf(shape.waveform.unwrap().options),
    defaultValue: (draft) => (draft.link === 'downlink' ? 'ofdm' : 'dft-s-ofdm'),
  },
  {
    kind: 'select',
    key: 'modulation',
    label: 'Modulation',
    options: () => optionsOf(shape.modulation.unwrap().options),
    defaultValue: () => 'qpsk',
  },
  {
    kind: 'number',
    key: 'oversampling',
    label: 'Oversampling',
    unit: '×',
    step: 1,
    hint: 'Whole factor 1–16 (zero-padded IFFT).',
    defaultValue: 1,
  },
  { kind: 'number', key: 'symbols', label: 'OFDM symbols', step: 1, defaultValue: 14 },
];

export const configFieldKeys: readonly string[] = configFields.map((field) => field.key);

/** Reads a number input: an empty or unparsable entry stays a string so the schema names the problem. */
export function parseNumberInput(text: string): number | string {
  const trimmed = text.trim();
  if (trimmed === '') return '';
  const value = Number(trimmed);
  return Number.isFinite(value) ? value : trimmed;
}
