/**
 * The built-in demo, set in an invented place: the Brackenmoor Fen test lab, a small regional lab
 * qualifying the uplink of the Saltway Regional Network (fictitious) on a conducted bench. The two
 * scenarios differ only in the waveform, so the workbench can show why DFT-s-OFDM needs less
 * amplifier back-off than OFDM for the same allocation (issue 7 pins both for the comparison).
 * Configurations are written as a user would write them for the CLI (defaults not applied).
 */
import type { WaveformConfigInput } from '../config/schema';

export interface Scenario {
  /** Short name shown in the header and in scenario lists. */
  name: string;
  /** One or two sentences on what the scenario is for. */
  description: string;
  config: WaveformConfigInput;
}

export const DEMO_SITE = 'Brackenmoor Fen test lab';
export const DEMO_NETWORK = 'Saltway Regional Network';

/**
 * LTE 10 MHz uplink (50 RB, TS 36.101 Table 5.6-1), a 40 RB PUSCH-like block from RB 5
 * (M_sc = 480 = 12·2^3·5, an allowed DFT size per TS 36.211 §5.3.3), 16QAM, PN15 payload,
 * one subframe, 4× oversampling so the time plot shows the envelope smoothly. The lab's bench amplifier is modelled
 * as a solid-state Rapp PA (smoothness 2) driven at 6 dB output back-off, so the spectrum, EVM and back-off panels
 * show what the amplifier does to each waveform.
 */
const saltwayUplink: WaveformConfigInput = {
  standard: 'lte',
  link: 'uplink',
  bandwidthMHz: 10,
  cyclicPrefix: 'normal',
  waveform: 'dft-s-ofdm',
  mapping: 'localized',
  allocation: { startRb: 5, numRb: 40 },
  modulation: '16qam',
  data: { source: 'pn15' },
  symbols: 14,
  oversampling: 4,
  amplifier: { model: 'rapp', smoothness: 2, backoffReference: 'obo', backoffDb: 6 },
};

export const demoScenarios: readonly Scenario[] = [
  {
    name: 'Saltway uplink, DFT-s-OFDM',
    description: `${DEMO_SITE}: qualifying the ${DEMO_NETWORK} uplink, LTE 10 MHz, 40 RB of 16QAM with transform precoding, into the bench PA at 6 dB OBO.`,
    config: saltwayUplink,
  },
  {
    name: 'Saltway uplink, OFDM (comparison)',
    description: `${DEMO_SITE}: the same 40 RB of 16QAM sent as plain OFDM into the same PA, the case the back-off comparison is made against.`,
    config: { ...saltwayUplink, waveform: 'ofdm' },
  },
];

/** The scenario the workbench opens with. */
export const defaultScenario: Scenario = demoScenarios[0]!;
