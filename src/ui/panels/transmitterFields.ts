/**
 * Form sections for the optional parts of a configuration: reference signals and the transmitter blocks
 * (spectrum shaping, windowing, PAPR reduction, impairments, amplifier). Each is off until switched on; the
 * values offered and their limits are the schema's (src/config/schema.ts, transmitterSchema.ts).
 */
import type { ConfigDraft } from '../state/configValidation';
import { readAtPath } from '../form/draftPath';
import type { ConfigField, ConfigSection, FieldOption } from './configFields';

const on = (path: string) => (draft: ConfigDraft) => readAtPath(draft, path) !== undefined;
const standardOf = (draft: ConfigDraft) => String(draft.standard ?? 'lte');
const linkOf = (draft: ConfigDraft) => String(draft.link ?? 'uplink');
const waveformOf = (draft: ConfigDraft) => String(draft.waveform ?? (linkOf(draft) === 'downlink' ? 'ofdm' : 'dft-s-ofdm'));
const rsOn = (draft: ConfigDraft) => readAtPath(draft, 'referenceSignals.enabled') === true;
const yesNo: FieldOption[] = [
  { value: true, label: 'Yes' },
  { value: false, label: 'No' },
];
const amplifierModel = (draft: ConfigDraft) => readAtPath(draft, 'amplifier.model');

function num(path: string, label: string, defaultValue: number | undefined, extra: Partial<Omit<Extract<ConfigField, { kind: 'number' }>, 'kind' | 'path' | 'label'>> = {}): ConfigField {
  return { kind: 'number', path, label, defaultValue, ...extra };
}

const referenceSection: ConfigSection = {
  id: 'reference',
  title: 'Reference signals',
  startClosed: true,
  fields: [
    {
      kind: 'toggle',
      path: 'referenceSignals',
      label: 'Reference signals',
      onValue: () => ({ enabled: true }),
      hint: (draft) => {
        if (!rsOn(draft)) return 'Off: a data-only waveform.';
        const s = standardOf(draft);
        if (s === 'lte') return linkOf(draft) === 'uplink' ? 'LTE PUSCH DMRS, TS 36.211 §5.5.2.1.' : 'LTE CRS port 0, TS 36.211 §6.10.1.';
        if (s === 'nr') return waveformOf(draft) === 'dft-s-ofdm' ? 'NR PUSCH DMRS, low-PAPR type 1, TS 38.211 §6.4.1.1.' : 'NR DMRS type 1 (Gold sequence), TS 38.211 §6.4.1.1.';
        return 'No reference signals are defined for a custom numerology.';
      },
    },
    num('referenceSignals.groupNumber', 'Group number u', 0, { step: 1, visible: (d) => rsOn(d) && (standardOf(d) === 'lte' || waveformOf(d) === 'dft-s-ofdm') }),
    num('referenceSignals.sequenceNumber', 'Sequence number v', 0, { step: 1, visible: (d) => rsOn(d) && (standardOf(d) === 'lte' || waveformOf(d) === 'dft-s-ofdm') }),
    num('referenceSignals.cyclicShift', 'Cyclic shift n_cs', 0, { step: 1, visible: (d) => rsOn(d) && standardOf(d) === 'lte' && linkOf(d) === 'uplink' }),
    num('referenceSignals.cellId', 'Cell identity', 0, { step: 1, visible: (d) => rsOn(d) && standardOf(d) === 'lte' && linkOf(d) === 'downlink' }),
    num('referenceSignals.scramblingId', 'Scrambling identity', 0, { step: 1, visible: (d) => rsOn(d) && standardOf(d) === 'nr' && waveformOf(d) === 'ofdm' }),
    num('referenceSignals.nScid', 'n_SCID', 0, { step: 1, visible: (d) => rsOn(d) && standardOf(d) === 'nr' && waveformOf(d) === 'ofdm' }),
    { kind: 'list', path: 'referenceSignals.dmrsSymbols', label: 'DMRS symbols', placeholder: '2, 7, 11', visible: (d) => rsOn(d) && standardOf(d) === 'nr', hint: 'Symbol indices within each slot (default 2, 7, 11).' },
  ],
};

const shapingSection: ConfigSection = {
  id: 'shaping',
  title: 'Spectrum shaping and windowing',
  startClosed: true,
  fields: [
    {
      kind: 'toggle',
      path: 'spectrumShaping',
      label: 'Spectrum shaping',
      onValue: () => ({}),
      hint: 'Frequency-domain shaping of the DFT output (DFT-s-OFDM only).',
    },
    {
      kind: 'select',
      path: 'spectrumShaping.shape',
      label: 'Shape',
      visible: on('spectrumShaping'),
      options: () => [
        { value: 'rrc', label: 'Root raised cosine' },
        { value: 'rc', label: 'Raised cosine' },
      ],
      defaultValue: () => 'rrc',
    },
    num('spectrumShaping.rollOff', 'Roll-off β', 0.25, { step: 0.05, visible: on('spectrumShaping') }),
    { kind: 'select', path: 'spectrumShaping.extension', label: 'Cyclic extension', visible: on('spectrumShaping'), options: () => yesNo, defaultValue: () => true, hint: 'Extend over ≈ β·M extra subcarriers, or shape inside the allocation.' },
    { kind: 'toggle', path: 'windowing', label: 'Symbol windowing', onValue: () => ({ rampLengthSamples: 8 }), hint: 'Raised-cosine ramps at the symbol edges.' },
    num('windowing.rampLengthSamples', 'Ramp length', undefined, { unit: 'samples', step: 1, visible: on('windowing'), hint: 'At the base rate (oversampling 1); at most the shortest CP.' }),
  ],
};

const paprSection: ConfigSection = {
  id: 'papr',
  title: 'PAPR reduction',
  startClosed: true,
  fields: [
    { kind: 'toggle', path: 'paprReduction', label: 'Clip and filter', onValue: () => ({}), hint: 'Iterative clipping and filtering of each symbol.' },
    num('paprReduction.clippingRatioDb', 'Clipping ratio', 5, { unit: 'dB', step: 0.5, visible: on('paprReduction'), hint: 'Clipping level over the RMS amplitude.' }),
    num('paprReduction.iterations', 'Iterations', 4, { step: 1, visible: on('paprReduction') }),
    {
      kind: 'select',
      path: 'paprReduction.filter',
      label: 'Filter keeps',
      visible: on('paprReduction'),
      options: () => [
        { value: 'allocated', label: 'Allocated subcarriers' },
        { value: 'grid', label: 'Whole grid' },
      ],
      defaultValue: () => 'allocated',
    },
  ],
};

const impairmentsSection: ConfigSection = {
  id: 'impairments',
  title: 'Impairments',
  startClosed: true,
  fields: [
    { kind: 'toggle', path: 'impairments', label: 'Impairments', onValue: () => ({}) },
    num('impairments.seed', 'Seed', 1, { step: 1, visible: on('impairments') }),
    { kind: 'toggle', path: 'impairments.iqImbalance', label: 'IQ imbalance', onValue: () => ({ gainDb: 0.2, phaseDeg: 1 }), visible: on('impairments') },
    num('impairments.iqImbalance.gainDb', 'Gain error', 0, { unit: 'dB', step: 0.1, visible: on('impairments.iqImbalance') }),
    num('impairments.iqImbalance.phaseDeg', 'Phase error', 0, { unit: '°', step: 0.5, visible: on('impairments.iqImbalance') }),
    { kind: 'toggle', path: 'impairments.dcOffset', label: 'LO leakage', onValue: () => ({ levelDbc: -35 }), visible: on('impairments') },
    num('impairments.dcOffset.levelDbc', 'Leakage level', undefined, { unit: 'dBc', step: 1, visible: on('impairments.dcOffset') }),
    { kind: 'toggle', path: 'impairments.phaseNoise', label: 'Phase noise', onValue: () => ({ linewidthHz: 100 }), visible: on('impairments') },
    num('impairments.phaseNoise.linewidthHz', '3 dB linewidth', undefined, { unit: 'Hz', visible: on('impairments.phaseNoise'), optional: true, hint: 'Wiener phase noise; a mask L(f) can be given in the JSON.' }),
    { kind: 'toggle', path: 'impairments.dac', label: 'DAC quantisation', onValue: () => ({ bits: 10 }), visible: on('impairments') },
    num('impairments.dac.bits', 'Bits per rail', undefined, { step: 1, visible: on('impairments.dac') }),
    num('impairments.dac.headroomDb', 'Headroom over RMS', 12, { unit: 'dB', step: 1, visible: on('impairments.dac') }),
    num('impairments.sampleClockPpm', 'Sample-clock offset', undefined, { unit: 'ppm', visible: on('impairments'), optional: true }),
  ],
};

const isModel = (model: string) => (draft: ConfigDraft) => amplifierModel(draft) === model;
const amplifierSection: ConfigSection = {
  id: 'amplifier',
  title: 'Amplifier',
  startClosed: true,
  fields: [
    {
      kind: 'toggle',
      path: 'amplifier',
      label: 'Power amplifier',
      onValue: () => ({ model: 'rapp', smoothness: 2, backoffDb: 6 }),
      hint: (draft) => (amplifierModel(draft) === 'polynomial' || amplifierModel(draft) === 'table' ? 'Coefficients and tables are edited in the JSON file (Open JSON…).' : undefined),
    },
    {
      kind: 'select',
      path: 'amplifier.model',
      label: 'Model',
      visible: on('amplifier'),
      options: () => [
        { value: 'rapp', label: 'Rapp (solid state)' },
        { value: 'saleh', label: 'Saleh (TWT)' },
        { value: 'limiter', label: 'Soft limiter' },
      ],
      defaultValue: () => 'rapp',
    },
    num('amplifier.smoothness', 'Smoothness p', 2, { step: 0.5, visible: isModel('rapp') }),
    num('amplifier.gainDb', 'Small-signal gain', 0, { unit: 'dB', step: 1, visible: (d) => isModel('rapp')(d) || isModel('limiter')(d) }),
    num('amplifier.outputSaturationAmplitude', 'Output saturation A_sat', 1, { visible: (d) => isModel('rapp')(d) || isModel('limiter')(d) }),
    num('amplifier.alphaA', 'α_a', 2.1587, { visible: isModel('saleh') }),
    num('amplifier.betaA', 'β_a', 1.1517, { visible: isModel('saleh') }),
    num('amplifier.alphaPhi', 'α_φ', 4.0033, { visible: isModel('saleh') }),
    num('amplifier.betaPhi', 'β_φ', 9.104, { visible: isModel('saleh') }),
    {
      kind: 'select',
      path: 'amplifier.backoffReference',
      label: 'Back-off set at',
      visible: on('amplifier'),
      options: () => [
        { value: 'obo', label: 'Output (OBO)' },
        { value: 'ibo', label: 'Input (IBO)' },
      ],
      defaultValue: () => 'obo',
    },
    num('amplifier.backoffDb', 'Back-off', 6, { unit: 'dB', step: 0.5, visible: on('amplifier'), hint: 'From saturation; the back-off panel sweeps it and solves for the least that meets the limits.' }),
  ],
};

export const transmitterSections: readonly ConfigSection[] = [referenceSection, shapingSection, paprSection, impairmentsSection, amplifierSection];

/** Sub-objects whose issues these sections show (anything under them is placed). */
export const transmitterSectionPaths: readonly string[] = ['referenceSignals', 'spectrumShaping', 'windowing', 'paprReduction', 'impairments', 'amplifier'];
