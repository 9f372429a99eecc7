/**
 * Payloads of the measurement requests (spectrum, EVM) as they cross between worker and page: the engine's
 * own result types, with their typed arrays as transferable ArrayBuffers. Types only.
 */
import type { DrivePoint } from '../dsp/amplifier/drive';
import type { AclrResult } from '../dsp/metrics/aclr';
import type { OccupiedBandwidth } from '../dsp/metrics/occupiedBandwidth';
import type { EvmReport } from '../dsp/receiver/evmMeasurement';

/** One ACLR measurement channel as drawn on the spectrum: centre, equivalent width ∫|H|² (B for a square filter, 1/T for RRC). */
export interface MeasurementBand {
  key: string;
  label: string;
  centreHz: number;
  widthHz: number;
  filter: string;
}

/** A Welch spectrum with its ACLR and occupied bandwidth (src/dsp/metrics). */
export interface SpectrumPayload<TBuffer = ArrayBuffer> {
  /** Bin centres from −f_s/2 upward, Hz. */
  frequenciesHz: TBuffer;
  /** Power per Hz, |x|² units per Hz. */
  psdPerHz: TBuffer;
  binWidthHz: number;
  rbwHz: number;
  sampleRateHz: number;
  window: string;
  segmentLength: number;
  numSegments: number;
  oversampling: number;
  symbols: number;
  aclr: AclrResult;
  occupiedBandwidth: OccupiedBandwidth;
  /** The measurement channels of the ACLR plan: assigned (key "assigned") and adjacent, centre and noise bandwidth. */
  bands: MeasurementBand[];
  /** What was measured: "generated waveform" or the transmitter steps applied. */
  source: string;
  warnings: string[];
}

/** Static AM/AM and AM/PM of the configured amplifier and where the waveform drives it. */
export interface AmplifierPayload<TBuffer = ArrayBuffer> {
  description: string;
  inputDbRelSat: TBuffer;
  outputDbRelSat: TBuffer;
  gainCompressionDb: TBuffer;
  phaseDeg: TBuffer;
  inputP1dbRelSatDb: number;
  /** The configured drive as solved on the waveform (IBO, OBO, mean powers). */
  drive: DrivePoint | null;
  memoryless: boolean;
}

/** EVM of the transmitted waveform (after the transmitter chain) through the reference receiver. */
export interface EvmPayload<TBuffer = ArrayBuffer> {
  /** "reference receiver" (two Annex F positions) or "grid check" (spectrum shaping: one complex gain). */
  method: string;
  evmRmsPercent: number;
  evmStandardErrorPercent: number | null;
  evmPeakPercent: number | null;
  evmLimitPercent: number | undefined;
  pass: boolean | undefined;
  limitSource: string;
  perModulation: EvmReport['perModulation'];
  perSymbolPercent: number[];
  /** Per grid subcarrier (NaN where no data); empty for the grid check. */
  perSubcarrierPercent: number[];
  /** Equalised data symbols, fill order (aligned with the generator's dataSymbolsIq); empty for the grid check. */
  constellationIq: TBuffer | null;
  window: EvmReport['window'] | null;
  transmitterSteps: string[];
  warnings: string[];
}
