/**
 * The fields of the configuration form, grouped in sections. Choices come from the zod schema (the
 * single source of truth) and, for bandwidth suggestions, from the standards' numerology tables;
 * labels are ours. Each field has the dotted path the schema and the engine report issues at.
 */
import { waveformConfigSchema } from '../../config/schema';
import { LTE_BANDWIDTHS } from '../../dsp/numerology/lteNumerology';
import { NR_FR1_NUM_RB } from '../../dsp/numerology/nrNumerology';
import { NR_DEFAULT_SCS_KHZ } from '../form/gridSize';
import type { ConfigDraft } from '../state/configValidation';
import { transmitterSectionPaths, transmitterSections } from './transmitterFields';

export { NR_DEFAULT_SCS_KHZ };

export interface FieldOption {
  value: string | number | boolean;
  label: string;
}

interface FieldBase {
  /** Dotted path in the configuration ("data.seed"), also where the schema reports its issues. */
  path: string;
  label: string;
  /** Shown under the field. */
  hint?: string | ((draft: ConfigDraft) => string | undefined);
  visible?: (draft: ConfigDraft) => boolean;
  /** Other paths whose issues (exactly at that path) this field shows, e.g. "data" for the data source. */
  alsoShows?: readonly string[];
}

export interface SelectField extends FieldBase {
  kind: 'select';
  options: (draft: ConfigDraft) => FieldOption[];
  /** Shown when the draft leaves the field out (the schema's default). */
  defaultValue: (draft: ConfigDraft) => string | number | boolean;
}

export interface NumberField extends FieldBase {
  kind: 'number';
  unit?: string;
  step?: number;
  /** Values offered in a datalist; any other value may still be typed. */
  suggestions?: (draft: ConfigDraft) => number[];
  /** Shown when the draft leaves the field out; undefined for an optional field with no default. */
  defaultValue: number | undefined;
  /** An empty entry removes the field (optional in the schema) instead of being an error. */
  optional?: boolean;
  placeholder?: string;
}

export interface TextField extends FieldBase {
  kind: 'text';
  defaultValue: string;
  placeholder?: string;
}

/** Switches an optional sub-object on (writes `onValue`) or off (removes it). */
export interface ToggleField extends FieldBase {
  kind: 'toggle';
  onValue: (draft: ConfigDraft) => unknown;
}

/** A list of whole numbers typed as "2, 7, 11". */
export interface ListField extends FieldBase {
  kind: 'list';
  placeholder?: string;
}

export type ConfigField = SelectField | NumberField | TextField | ToggleField | ListField;

export interface ConfigSection {
  id: string;
  title: string;
  /** Sections for optional blocks start closed. */
  startClosed?: boolean;
  fields: readonly ConfigField[];
  /** A custom editor rendered after the fields (e.g. the RB picker). */
  editor?: 'allocation';
}

const shape = waveformConfigSchema.shape;

const displayNames: Record<string, string> = {
  lte: 'LTE',
  nr: 'NR',
  custom: 'Custom numerology',
  uplink: 'Uplink',
  downlink: 'Downlink',
  normal: 'Normal',
  extended: 'Extended',
  ofdm: 'CP-OFDM',
  'dft-s-ofdm': 'DFT-s-OFDM (SC-FDMA)',
  localized: 'Localized (contiguous)',
  interleaved: 'Interleaved (comb)',
  bpsk: 'BPSK',
  'pi/2-bpsk': 'π/2-BPSK',
  qpsk: 'QPSK',
  '16qam': '16QAM',
  '64qam': '64QAM',
  '256qam': '256QAM',
  '1024qam': '1024QAM',
  pn9: 'PN9 (ITU-T O.150)',
  pn15: 'PN15 (ITU-T O.150)',
  pn23: 'PN23 (ITU-T O.150)',
  random: 'Seeded random bits',
  bits: 'Fixed bits (hex)',
};

export function displayName(value: string): string {
  return displayNames[value] ?? value;
}

const optionsOf = (values: readonly string[]): FieldOption[] => values.map((value) => ({ value, label: displayName(value) }));

/** The data sources the schema's discriminated union accepts, in its order. */
export const DATA_SOURCES: readonly string[] = shape.data
  .unwrap()
  .options.map((option) => String(option.shape.source.value));

const isNr = (draft: ConfigDraft) => draft.standard === 'nr';
const isCustom = (draft: ConfigDraft) => draft.standard === 'custom';
const isInterleaved = (draft: ConfigDraft) => draft.mapping === 'interleaved';
const dataSource = (draft: ConfigDraft) => (draft.data as { source?: unknown } | undefined)?.source ?? 'pn9';

function bandwidthSuggestions(draft: ConfigDraft): number[] {
  if (isNr(draft)) {
    const scs = typeof draft.subcarrierSpacingKHz === 'number' ? draft.subcarrierSpacingKHz : NR_DEFAULT_SCS_KHZ;
    return Object.keys(NR_FR1_NUM_RB[scs] ?? {}).map(Number);
  }
  return LTE_BANDWIDTHS.map((row) => row.bandwidthMHz);
}

function carrierHint(draft: ConfigDraft): string | undefined {
  const hz = draft.carrierFrequencyHz;
  if (typeof hz !== 'number' || !(hz > 0)) return 'Optional. NR applies the TS 38.211 §5.4 phase term; recorded in file metadata.';
  return hz >= 1e9 ? `${(hz / 1e9).toPrecision(6)} GHz` : `${(hz / 1e6).toPrecision(6)} MHz`;
}

const carrierSection: ConfigSection = {
  id: 'carrier',
  title: 'Carrier',
  fields: [
    {
      kind: 'select',
      path: 'standard',
      label: 'Standard',
      options: () => optionsOf(shape.standard.unwrap().options),
      defaultValue: () => 'lte',
    },
    {
      kind: 'select',
      path: 'link',
      label: 'Link',
      options: () => optionsOf(shape.link.unwrap().options),
      defaultValue: () => 'uplink',
    },
    {
      kind: 'number',
      path: 'bandwidthMHz',
      label: 'Channel bandwidth',
      unit: 'MHz',
      step: 0.1,
      suggestions: bandwidthSuggestions,
      defaultValue: 20,
      visible: (draft) => !isCustom(draft),
    },
    {
      kind: 'select',
      path: 'subcarrierSpacingKHz',
      label: 'Subcarrier spacing',
      visible: isNr,
      options: () => Object.keys(NR_FR1_NUM_RB).map((scs) => ({ value: Number(scs), label: `${scs} kHz (μ = ${Math.log2(Number(scs) / 15)})` })),
      defaultValue: () => NR_DEFAULT_SCS_KHZ,
    },
    {
      kind: 'number',
      path: 'subcarrierSpacingKHz',
      label: 'Subcarrier spacing',
      unit: 'kHz',
      visible: isCustom,
      defaultValue: 15,
      optional: true,
    },
    { kind: 'number', path: 'custom.fftSize', label: 'FFT size', step: 1, visible: isCustom, alsoShows: ['custom'], defaultValue: undefined, hint: '16…65536; any size (mixed radix or Bluestein).' },
    { kind: 'number', path: 'custom.numRb', label: 'Resource blocks', unit: 'RB', step: 1, visible: isCustom, defaultValue: undefined },
    { kind: 'number', path: 'custom.cpLengthSamples', label: 'Cyclic prefix length', unit: 'samples', step: 1, visible: isCustom, defaultValue: undefined },
    {
      kind: 'select',
      path: 'cyclicPrefix',
      label: 'Cyclic prefix',
      options: () => optionsOf(shape.cyclicPrefix.unwrap().options),
      defaultValue: () => 'normal',
      visible: (draft) => !isCustom(draft),
    },
    {
      kind: 'number',
      path: 'carrierFrequencyHz',
      label: 'Carrier frequency',
      unit: 'Hz',
      defaultValue: undefined,
      optional: true,
      placeholder: 'e.g. 3.5e9',
      hint: carrierHint,
    },
  ],
};

const waveformSection: ConfigSection = {
  id: 'waveform',
  title: 'Waveform and mapping',
  fields: [
    {
      kind: 'select',
      path: 'waveform',
      label: 'Waveform',
      options: () => optionsOf(shape.waveform.unwrap().options),
      defaultValue: (draft) => (draft.link === 'downlink' ? 'ofdm' : 'dft-s-ofdm'),
    },
    {
      kind: 'select',
      path: 'modulation',
      label: 'Modulation',
      options: () => optionsOf(shape.modulation.unwrap().options),
      defaultValue: () => 'qpsk',
      hint: 'Blocks without their own modulation use this one.',
    },
    {
      kind: 'select',
      path: 'mapping',
      label: 'Subcarrier mapping',
      options: () => optionsOf(shape.mapping.unwrap().options),
      defaultValue: () => 'localized',
    },
    {
      kind: 'number',
      path: 'interleaveFactor',
      label: 'Interleave factor Q',
      step: 1,
      defaultValue: 2,
      visible: isInterleaved,
      hint: 'Data on every Q-th subcarrier (2…64); a research option, not a 3GPP PUSCH mode.',
    },
    {
      kind: 'number',
      path: 'combOffset',
      label: 'Comb offset',
      step: 1,
      defaultValue: 0,
      visible: isInterleaved,
      hint: 'Which subcarrier of each group of Q carries data (0…Q−1).',
    },
  ],
};

const allocationSection: ConfigSection = { id: 'allocation', title: 'Allocation', fields: [], editor: 'allocation' };

const payloadSection: ConfigSection = {
  id: 'payload',
  title: 'Payload and length',
  fields: [
    {
      kind: 'select',
      path: 'data.source',
      label: 'Data source',
      alsoShows: ['data'],
      options: () => optionsOf(DATA_SOURCES),
      defaultValue: () => 'pn9',
    },
    { kind: 'number', path: 'data.seed', label: 'Seed', step: 1, defaultValue: undefined, visible: (draft) => dataSource(draft) === 'random' },
    {
      kind: 'text',
      path: 'data.hex',
      label: 'Bits (hex)',
      defaultValue: '',
      placeholder: 'A5F0…',
      visible: (draft) => dataSource(draft) === 'bits',
      hint: 'Repeated to fill the allocation; MSB first.',
    },
    { kind: 'number', path: 'symbols', label: 'OFDM symbols', step: 1, defaultValue: 14, hint: '14 = one LTE subframe or one NR slot at 15 kHz.' },
    {
      kind: 'number',
      path: 'oversampling',
      label: 'Oversampling',
      unit: '×',
      step: 1,
      hint: 'Whole factor 1–16 (zero-padded IFFT).',
      defaultValue: 1,
    },
  ],
};

/** The form, top to bottom. */
export const configSections: readonly ConfigSection[] = [carrierSection, waveformSection, allocationSection, payloadSection, ...transmitterSections];

export const configFields: readonly ConfigField[] = configSections.flatMap((section) => section.fields);

/** Paths the form shows issues at; anything else is listed under the form. */
export const configFieldKeys: readonly string[] = [
  ...new Set([...configFields.map((field) => field.path), 'allocation', 'data', 'custom', ...transmitterSectionPaths]),
];

/** Reads a number input: an empty or unparsable entry stays a string so the schema names the problem. */
export function parseNumberInput(text: string): number | string {
  const trimmed = text.trim();
  if (trimmed === '') return '';
  const value = Number(trimmed);
  return Number.isFinite(value) ? value : trimmed;
}

/** Reads "2, 7, 11" as [2, 7, 11]; an entry that is not a number stays text so the schema names it; empty removes the field. */
export function parseListInput(text: string): unknown[] | undefined {
  const parts = text
    .split(/[\s,;]+/)
    .map((p) => p.trim())
    .filter((p) => p !== '');
  if (parts.length === 0) return undefined;
  return parts.map((p) => (Number.isFinite(Number(p)) ? Number(p) : p));
}
