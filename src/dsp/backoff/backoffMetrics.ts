import { levelsFromHistogram } from '../metrics/ccdfLevels';
import { createDbHistogram, POWER_HISTOGRAM_SPEC } from '../metrics/dbHistogram';
import { aclrPlanFor, aclrSpanHz, computeAclr, type AclrPlan } from '../metrics/aclr';
import { createPowerBinner, binPowersInto } from '../metrics/powerBinner';
import { computeWelchPsd } from '../metrics/welchPsd';
import { DspError } from '../errors';
import { measureEvm } from '../receiver/evmMeasurement';
import { measureGridEvm } from '../txcheck/gridEvm';
import type { SymbolLayout, WaveformPlan } from '../waveform/waveformPlan';

/** What the back-off sweep measures on each amplified signal. */
export interface BackoffMetrics {
  /** RMS EVM of the amplified signal against the ideal grid, %, with its standard error. */
  evm(outputIq: Float64Array): { evmRmsPercent: number; evmStandardErrorPercent: number };
  /** ACLR per adjacent channel key, dB, with the standard error of each from the spread over record quarters. */
  aclr(outputIq: Float64Array): { aclrDb: Record<string, number>; standardErrorDb: Record<string, number> };
  /** How each metric is measured, for reports. */
  readonly methods: { readonly evm: string; readonly aclr: string };
  /** The adjacent channels measured (keys of `aclr`). */
  readonly aclrChannels: readonly string[];
}

/** The parts of a generated waveform the metrics need. */
export interface MetricsWaveform {
  readonly plan: WaveformPlan;
  readonly symbolLayout: readonly SymbolLayout[];
  readonly gridIq: Float64Array;
  readonly gridKinds: Uint8Array;
  readonly sampleRateHz: number;
}

/**
 * Metrics for a generated waveform, no channel:
 * - EVM through the reference receiver (src/dsp/receiver/evmMeasurement.ts: known timing, zero-forcing equaliser from the
 *   reference signals or, for data-only waveforms, from the known transmit grid; the larger EVM of the two Annex F window
 *   positions). With spectrum shaping the receiver does not undo the shaping, so the known-timing grid EVM
 *   (txcheck/gridEvm.ts, matched combining, one complex gain) is used instead and the method says so.
 *   Standard error from the spread of per-symbol EVM² (delta method).
 * - ACLR per the standard's adjacent channels from a Welch PSD (src/dsp/metrics: aclrPlanFor, computeAclr).
 * @param rbwHz Welch resolution bandwidth (default channel bandwidth / 200: ACLR integrates over MHz, and a coarse RBW
 *        averages ~30 segments even on a 1 ms record)
 * @throws DspError INVALID_CONFIG when the sample rate does not cover the adjacent channels
 */
export function createWaveformMetrics(wave: MetricsWaveform, rbwHz?: number): BackoffMetrics {
  const numerology = wave.plan.numerology;
  const aclrPlan: AclrPlan = aclrPlanFor(numerology);
  const rbw = rbwHz ?? defaultBackoffRbwHz(numerology.channelBandwidthHz);
  const span = aclrSpanHz(aclrPlan) + 4 * rbw;
  if (span > wave.sampleRateHz / 2) {
    throw new DspError(
      'INVALID_CONFIG',
      `ACLR needs the spectrum out to ±${(span / 1e6).toFixed(2)} MHz but the waveform is sampled at ${(wave.sampleRateHz / 1e6).toFixed(2)} Msps; raise oversampling to ${Math.ceil((2 * span) / numerology.sampleRateHz)}.`,
      { field: 'oversampling' },
    );
  }
  const shaped = wave.plan.allocations.some((a) => a.shaping !== undefined);
  const referenceOn = wave.plan.config.referenceSignals?.enabled === true;
  return {
    evm(outputIq) {
      if (shaped) {
        const r = measureGridEvm(wave.plan, wave.symbolLayout, wave.gridIq, outputIq, { gridKinds: wave.gridKinds });
        return { evmRmsPercent: r.evmRmsPercent, evmStandardErrorPercent: r.evmStandardErrorPercent };
      }
      const { report } = measureEvm(wave.plan, outputIq, {
        timing: 'known',
        knownTimingOffsetSamples: 0,
        channelEstimation: referenceOn ? 'reference' : 'known-grid',
        ...(referenceOn ? {} : { transmittedGridIq: wave.gridIq }),
      });
      return { evmRmsPercent: report.evmRmsPercent, evmStandardErrorPercent: perSymbolStandardError(report.perSymbolPercent, report.evmRmsPercent) };
    },
    aclr(outputIq) {
      const welch = { sampleRateHz: wave.sampleRateHz, rbwHz: rbw, window: 'hann' as const };
      const aclrDb: Record<string, number> = {};
      for (const v of computeAclr(computeWelchPsd(outputIq, welch), aclrPlan).values) aclrDb[v.key] = v.aclrDb;
      // Statistical error: ACLR of each quarter of the record; standard error of their mean in dB (common practice).
      const standardErrorDb: Record<string, number> = {};
      const quarter = 2 * Math.floor(outputIq.length / 2 / ACLR_CHUNKS);
      const perChunk: Record<string, number[]> = {};
      try {
        for (let c = 0; c < ACLR_CHUNKS; c++) {
          const psd = computeWelchPsd(outputIq.subarray(c * quarter, (c + 1) * quarter), welch);
          for (const v of computeAclr(psd, aclrPlan).values) (perChunk[v.key] ??= []).push(v.aclrDb);
        }
        for (const [key, values] of Object.entries(perChunk)) {
          const mean = values.reduce((a, b) => a + b, 0) / values.length;
          const variance = values.reduce((a, b) => a + (b - mean) ** 2, 0) / (values.length - 1);
          standardErrorDb[key] = Number.isFinite(variance) ? Math.sqrt(variance / values.length) : 0;
        }
      } catch (err) {
        // A quarter shorter than one Welch segment: no error estimate (reported as 0).
        if (!(err instanceof DspError)) throw err;
      }
      return { aclrDb, standardErrorDb };
    },
    methods: {
      evm: shaped
        ? 'known-timing grid EVM after matched combining of the shaped spectrum (one complex gain over the record, data REs; TS 36.101 Annex F.2 form), no channel'
        : `reference receiver EVM, known timing, ZF from ${referenceOn ? 'the reference signals' : 'the known transmit grid'}, larger of the two Annex F window positions (TS 36.101 / TS 38.101-1 Annex F), no channel`,
      aclr: `Welch PSD (Hann, RBW ${(rbw / 1e3).toFixed(1)} kHz) through the standard's channel filters; standard error from the spread over ${ACLR_CHUNKS} record quarters`,
    },
    aclrChannels: aclrPlan.channels.map((c) => c.key),
  };
}

/** Standard error of an RMS EVM from its per-symbol values (NaN for symbols without data are skipped): se(EVM²)/(2·EVM). */
function perSymbolStandardError(perSymbolPercent: readonly number[], evmPercent: number): number {
  const squares = perSymbolPercent.filter((v) => Number.isFinite(v)).map((v) => v * v);
  const n = squares.length;
  if (n < 2 || !(evmPercent > 0)) return 0;
  const mean = squares.reduce((a, b) => a + b, 0) / n;
  const variance = squares.reduce((a, b) => a + (b - mean) ** 2, 0) / (n - 1);
  return Math.sqrt(variance / n) / (2 * evmPercent);
}

/** Record pieces whose ACLR spread gives the statistical error. */
export const ACLR_CHUNKS = 4;

/** Instantaneous-power CCDF levels of a signal (dB over its mean) at 10⁻³ and 10⁻⁴, null where the record is too short. */
export function powerCcdfLevelsDb(signalIq: Float64Array): { '1e-3': number | null; '1e-4': number | null } {
  const n = signalIq.length / 2;
  const powers = new Float64Array(n);
  let mean = 0;
  for (let i = 0; i < n; i++) {
    powers[i] = signalIq[2 * i]! ** 2 + signalIq[2 * i + 1]! ** 2;
    mean += powers[i]!;
  }
  mean /= n;
  const histogram = createDbHistogram(POWER_HISTOGRAM_SPEC);
  binPowersInto(createPowerBinner(POWER_HISTOGRAM_SPEC, mean), powers, 0, n, histogram);
  const { levels } = levelsFromHistogram(histogram, { what: 'power after the PA', unit: 'samples' }, [1e-3, 1e-4]);
  return { '1e-3': levels[0]!.levelDb, '1e-4': levels[1]!.levelDb };
}

/** Default Welch RBW of the back-off sweep: channel bandwidth / 200 (25 kHz at 5 MHz, 100 kHz at 20 MHz). */
export function defaultBackoffRbwHz(channelBandwidthHz: number): number {
  return channelBandwidthHz / 200;
}
