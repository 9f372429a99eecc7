import { addAwgn, meanPowerOf } from '../channel/awgn';
import type { DelayProfileName } from '../channel/delayProfiles';
import { DELAY_PROFILES } from '../channel/delayProfiles';
import { applyFrequencyOffset, applyTimingOffset } from '../channel/impairments';
import { applyMultipathChannel, createMultipathChannel, tapFrequencyResponses } from '../channel/multipathChannel';
import { resolveNoiseLevel, type NoiseReference } from '../channel/noiseLevels';
import { createRng, deriveBlockSeed } from '../data/rng';
import { DspError } from '../errors';
import { bitsPerSymbol } from '../modulation/constellations';
import { countErrors, type ErrorCounts } from '../receiver/errorCounting';
import { theoreticalBer } from '../receiver/errorRateTheory';
import { receiveWaveform, type ChannelEstimationMode } from '../receiver/referenceReceiver';
import type { EqualizerKind } from '../receiver/equalisation';
import { RE_DATA } from '../waveform/resourceKinds';
import { gridSubcarrierFrequencyHz } from '../waveform/subcarrierLayout';
import type { GeneratedWaveform } from '../waveform/waveformGenerator';
import { symbolLayoutOf } from '../waveform/waveformPlan';

/**
 * Link-level BER/SER sweep over Eb/N0 (noiseLevels.ts defines Eb/N0, Es/N0 and SNR): for each of `repeats` independent
 * drops the waveform passes the channel (AWGN only, or an EPA/EVA/ETU fading channel with its own seeded realisation),
 * optional CFO and timing offset, then AWGN at each Eb/N0 (the same drops at every point), and the reference receiver.
 * With reference signals on, the receiver estimates the channel from them; with them off it is given the simulated
 * channel (ideal channel knowledge, H = 1 for AWGN) and the true noise variance. Every random source derives from `seed`.
 */
export interface LinkSimulationOptions {
  readonly channel: 'awgn' | DelayProfileName;
  /** Maximum Doppler, Hz (default: the profile's pairing in delayProfiles.ts). */
  readonly dopplerHz?: number;
  readonly ebN0Db: readonly number[];
  readonly seed: number;
  readonly repeats: number;
  readonly equalizer?: EqualizerKind;
  readonly cfoHz?: number;
  readonly timingOffsetSamples?: number;
  /** 'known' timing (default), or CP-based timing and CFO estimation. */
  readonly sync?: 'known' | 'cp';
  readonly frequencyWindow?: number;
  /** FFT window advance before the CP end (default: an eighth of the shortest CP). */
  readonly windowAdvanceSamples?: number;
}

/** Totals of one Eb/N0 point over all drops (the error counts of every drop added, then BER and SER). */
export interface LinkPoint extends ErrorCounts {
  readonly ebN0Db: number;
  readonly esN0Db: number;
  readonly snrDb: number;
  /** AWGN theory for the (single) modulation, when the channel is AWGN. */
  readonly theoryBer: number | undefined;
}

/** A sweep's points and how it was run. */
export interface LinkSimulationResult {
  readonly points: readonly LinkPoint[];
  readonly channelKnowledge: ChannelEstimationMode;
  readonly dopplerHz: number;
  readonly notes: readonly string[];
}

/**
 * Runs the sweep described above.
 * @throws DspError INVALID_CONFIG for a repeat count below 1
 */
export function runLinkSimulation(wave: GeneratedWaveform, options: LinkSimulationOptions): LinkSimulationResult {
  const plan = wave.plan;
  if (!Number.isInteger(options.repeats) || options.repeats < 1) {
    throw new DspError('INVALID_CONFIG', `repeats ${options.repeats} must be a whole number ≥ 1.`, { field: 'repeats' });
  }
  const k = plan.numerology.numGridSubcarriers;
  const reference = noiseReferenceOf(wave);
  const rsOn = plan.referenceSignals.kind !== 'none';
  const knowledge: ChannelEstimationMode = rsOn ? 'reference' : 'ideal';
  const fading = options.channel !== 'awgn';
  const dopplerHz = fading ? (options.dopplerHz ?? DELAY_PROFILES[options.channel].defaultDopplerHz) : 0;
  const minCp = Math.min(...plan.ofdm.cpLengthsSamples);
  const advance = options.windowAdvanceSamples ?? Math.floor(minCp / 8);
  const frequencies = Float64Array.from({ length: k }, (_, i) => gridSubcarrierFrequencyHz(plan.numerology, i));
  const modulations = [...new Set(plan.allocations.map((a) => a.modulation))];
  const totals = options.ebN0Db.map(() => ({ bitErrors: 0, numBits: 0, symbolErrors: 0, numSymbols: 0 }));
  const figures = options.ebN0Db.map((ebN0Db) => resolveNoiseLevel({ ebN0Db }, reference));
  for (let r = 0; r < options.repeats; r++) {
    let pathIq: Float64Array = wave.waveformIq;
    let idealChannel: ((l: number, row: Float64Array) => void) | undefined;
    if (fading) {
      const channel = createMultipathChannel({
        profile: options.channel,
        dopplerHz,
        sampleRateHz: plan.sampleRateHz,
        seed: deriveBlockSeed(options.seed, 2 * r),
      });
      const gains: Float64Array[] = [];
      pathIq = applyMultipathChannel(channel, wave.waveformIq, 0, new Float64Array(wave.waveformIq.length), gains);
      const responses = tapFrequencyResponses(channel, frequencies);
      idealChannel = (l, row) => {
        const s = symbolLayoutOf(plan, l);
        const first = s.startSample + s.cpLengthSamples - advance;
        row.fill(0);
        gains.forEach((g, p) => {
          // The mean tap gain over the FFT window is what a one-tap equaliser sees.
          let gRe = 0;
          let gIm = 0;
          for (let n = first; n < first + s.fftSize; n++) {
            gRe += g[2 * n]!;
            gIm += g[2 * n + 1]!;
          }
          gRe /= s.fftSize;
          gIm /= s.fftSize;
          const resp = responses[p]!;
          for (let i = 0; i < k; i++) {
            row[2 * i] = row[2 * i]! + gRe * resp[2 * i]! - gIm * resp[2 * i + 1]!;
            row[2 * i + 1] = row[2 * i + 1]! + gRe * resp[2 * i + 1]! + gIm * resp[2 * i]!;
          }
        });
      };
    }
    if (options.cfoHz) pathIq = applyFrequencyOffset(pathIq, options.cfoHz, plan.sampleRateHz, new Float64Array(pathIq.length));
    if (options.timingOffsetSamples) pathIq = applyTimingOffset(pathIq, options.timingOffsetSamples);
    figures.forEach((f, p) => {
      const rng = createRng(deriveBlockSeed(options.seed, 2 * r + 1 + 1000003 * (p + 1)));
      const rxIq = addAwgn(pathIq, f.noiseVariance, rng, new Float64Array(pathIq.length));
      const rx = receiveWaveform(plan, rxIq, {
        timing: options.sync ?? 'known',
        knownTimingOffsetSamples: Math.round(options.timingOffsetSamples ?? 0),
        windowAdvanceSamples: advance,
        channelEstimation: knowledge,
        ...(idealChannel ? { idealChannel } : {}),
        ...(knowledge === 'ideal' ? { noiseVariance: f.noiseVariance / plan.ofdm.ifftSize } : {}),
        equalizer: options.equalizer ?? 'zf',
        frequencyWindow: options.frequencyWindow ?? (fading ? 1 : 7),
        timeInterpolation: 'linear',
      });
      const c = countErrors(plan, wave.bits, rx.bits);
      const t = totals[p]!;
      t.bitErrors += c.bitErrors;
      t.numBits += c.numBits;
      t.symbolErrors += c.symbolErrors;
      t.numSymbols += c.numSymbols;
    });
  }
  const notes = [
    `channel: ${fading ? `${options.channel.toUpperCase()} (TS 36.101 Annex B.2), Doppler ${dopplerHz} Hz, sum-of-sinusoids Rayleigh taps` : 'AWGN'}`,
    rsOn ? `channel estimated from the reference signals (${plan.referenceSignals.description})` : 'reference signals off: the receiver is given the simulated channel and noise variance (ideal channel knowledge)',
    `Eb/N0 counts data energy only; Es/N0 per data symbol over the useful symbol part; SNR over the sampled bandwidth ${(plan.sampleRateHz / 1e6).toFixed(2)} MHz`,
  ];
  const offset = options.timingOffsetSamples ?? 0;
  if (!rsOn && (offset !== Math.round(offset) || options.cfoHz)) {
    notes.push('the ideal channel knowledge does not include the CFO or the fractional part of the timing offset: switch reference signals on to estimate them');
  }
  return {
    channelKnowledge: knowledge,
    dopplerHz,
    notes,
    points: options.ebN0Db.map((ebN0Db, p) => {
      const t = totals[p]!;
      return {
        ebN0Db,
        esN0Db: figures[p]!.esN0Db,
        snrDb: figures[p]!.snrDb,
        ...t,
        ber: t.bitErrors / t.numBits,
        ser: t.symbolErrors / t.numSymbols,
        theoryBer: !fading && modulations.length === 1 ? theoreticalBer(modulations[0]!, ebN0Db) : undefined,
      };
    }),
  };
}

/** The waveform's measured noise reference: P_s, mean data-element energy, IFFT size and bits per data symbol. */
export function noiseReferenceOf(wave: GeneratedWaveform): NoiseReference {
  let energy = 0;
  let count = 0;
  for (let i = 0; i < wave.gridKinds.length; i++) {
    if (wave.gridKinds[i] !== RE_DATA) continue;
    energy += wave.gridIq[2 * i]! ** 2 + wave.gridIq[2 * i + 1]! ** 2;
    count++;
  }
  const numData = wave.dataSymbolsIq.length / 2;
  return {
    signalPowerLinear: meanPowerOf(wave.waveformIq),
    dataReEnergyLinear: count > 0 ? energy / count : 0,
    ifftSize: wave.plan.ofdm.ifftSize,
    bitsPerDataSymbol: numData > 0 ? wave.bits.length / numData : bitsPerSymbol(wave.plan.allocations[0]!.modulation),
  };
}
