import type { Command } from 'commander';
import type { DelayProfileName } from '../../dsp/channel/delayProfiles';
import { DspError } from '../../dsp/errors';
import { runLinkSimulation } from '../../dsp/link/linkSimulation';
import { describeConfig } from '../../dsp/waveform/configDescription';
import { generateWaveform } from '../../dsp/waveform/waveformGenerator';
import type { CliIo } from '../main';
import { readConfigFile } from '../readConfig';

interface LinkOptions {
  config: string;
  channel: string;
  ebn0: string;
  json?: boolean;
  doppler?: string;
  repeats: string;
  seed: string;
  equalizer: string;
  cfoHz?: string;
  timingOffset?: string;
  sync: string;
}

/** Largest number of Eb/N0 points one sweep may ask for. */
const MAX_POINTS = 200;

/** Parses "A:B:STEP" (or a single "A") into the Eb/N0 list, inclusive of B within rounding. */
export function parseEbN0Range(text: string): number[] {
  const parts = text.split(':').map((p) => Number(p.trim()));
  const bad = (why: string): DspError => new DspError('INVALID_CONFIG', `--ebn0 "${text}" ${why}; write A:B:STEP in dB, e.g. 0:10:2, or a single value.`);
  if (parts.some((p) => !Number.isFinite(p)) || (parts.length !== 1 && parts.length !== 3)) throw bad('is not a number or A:B:STEP');
  if (parts.length === 1) return [parts[0]!];
  const [a, b, step] = parts as [number, number, number];
  if (!(step > 0)) throw bad('needs a positive STEP');
  if (b < a) throw bad('needs B ≥ A');
  const count = Math.floor((b - a) / step + 1e-9) + 1;
  if (count > MAX_POINTS) throw bad(`gives ${count} points, more than ${MAX_POINTS}`);
  return Array.from({ length: count }, (_, i) => Math.round((a + i * step) * 1e9) / 1e9);
}

function parseNumber(text: string | undefined, name: string, check: (x: number) => boolean, allowed: string): number | undefined {
  if (text === undefined) return undefined;
  const x = Number(text);
  if (!Number.isFinite(x) || !check(x)) throw new DspError('INVALID_CONFIG', `${name} "${text}" is not allowed: ${allowed}.`);
  return x;
}

/**
 * `crestline link --config cfg.json --channel awgn|epa|eva|etu --ebn0 A:B:STEP [--json]`: BER/SER sweep of the configured
 * waveform through the channel and the reference receiver (linkSimulation.ts).
 */
export function registerLink(program: Command, io: CliIo): void {
  program
    .command('link')
    .description('BER/SER versus Eb/N0 of the configured waveform over AWGN or an EPA/EVA/ETU fading channel')
    .requiredOption('--config <file>', 'waveform configuration (JSON)')
    .requiredOption('--channel <name>', 'awgn, epa, eva or etu (TS 36.101 Annex B.2)')
    .requiredOption('--ebn0 <A:B:STEP>', 'Eb/N0 points in dB, e.g. 0:10:2')
    .option('--json', 'print one JSON object')
    .option('--doppler <hz>', 'maximum Doppler frequency, Hz (default EPA 5, EVA 70, ETU 300)')
    .option('--repeats <n>', 'independent drops of the whole waveform per point', '4')
    .option('--seed <n>', 'seed of every random source (channel, noise)', '1')
    .option('--equalizer <kind>', 'zf or mmse', 'zf')
    .option('--cfo-hz <hz>', 'carrier frequency offset added to the path, Hz')
    .option('--timing-offset <samples>', 'delay added to the path, samples (fractional allowed)')
    .option('--sync <mode>', 'known timing, or cp: estimate timing and CFO from the cyclic prefix', 'known')
    .action((opts: LinkOptions) => {
      const channels = ['awgn', 'epa', 'eva', 'etu'];
      if (!channels.includes(opts.channel)) throw new DspError('INVALID_CONFIG', `--channel "${opts.channel}" is not allowed: use ${channels.join(', ')}.`);
      if (opts.equalizer !== 'zf' && opts.equalizer !== 'mmse') throw new DspError('INVALID_CONFIG', `--equalizer "${opts.equalizer}" is not allowed: use zf or mmse.`);
      if (opts.sync !== 'known' && opts.sync !== 'cp') throw new DspError('INVALID_CONFIG', `--sync "${opts.sync}" is not allowed: use known or cp.`);
      const ebN0Db = parseEbN0Range(opts.ebn0);
      const repeats = parseNumber(opts.repeats, '--repeats', (x) => Number.isInteger(x) && x >= 1 && x <= 10000, 'a whole number from 1 to 10000')!;
      const seed = parseNumber(opts.seed, '--seed', (x) => Number.isSafeInteger(x) && x >= 0, 'a whole number ≥ 0')!;
      const dopplerHz = parseNumber(opts.doppler, '--doppler', (x) => x >= 0 && x <= 10000, 'a frequency from 0 to 10000 Hz');
      const cfoHz = parseNumber(opts.cfoHz, '--cfo-hz', (x) => Math.abs(x) < 1e7, 'a finite frequency in Hz');
      const timingOffsetSamples = parseNumber(opts.timingOffset, '--timing-offset', (x) => x >= 0 && x <= 1e6, 'a delay from 0 to 1e6 samples');
      if (opts.sync === 'known' && cfoHz) io.stderr('warning: --cfo-hz with --sync known leaves the offset uncorrected; add --sync cp to estimate it.');
      const config = readConfigFile(opts.config);
      const wave = generateWaveform(config);
      const result = runLinkSimulation(wave, {
        channel: opts.channel as 'awgn' | DelayProfileName,
        ebN0Db,
        seed,
        repeats,
        equalizer: opts.equalizer,
        sync: opts.sync,
        ...(dopplerHz !== undefined ? { dopplerHz } : {}),
        ...(cfoHz !== undefined ? { cfoHz } : {}),
        ...(timingOffsetSamples !== undefined ? { timingOffsetSamples } : {}),
      });
      if (opts.json) {
        io.stdout(
          JSON.stringify({
            channel: opts.channel,
            dopplerHz: result.dopplerHz,
            channelKnowledge: result.channelKnowledge,
            seed,
            repeats,
            points: result.points.map((p) => ({ ...p, theoryBer: p.theoryBer ?? null })),
            notes: result.notes,
            warnings: wave.warnings,
          }),
        );
        return;
      }
      io.stdout(`${describeConfig(config)}; ${repeats} drops per point, seed ${seed}`);
      for (const n of result.notes) io.stdout(`  ${n}`);
      io.stdout('Eb/N0 dB  Es/N0 dB  SNR dB    BER         SER         bit errors / bits   AWGN theory BER');
      for (const p of result.points) {
        const theory = p.theoryBer === undefined ? '' : p.theoryBer.toExponential(3);
        io.stdout(
          `${p.ebN0Db.toFixed(2).padStart(8)}  ${p.esN0Db.toFixed(2).padStart(8)}  ${p.snrDb.toFixed(2).padStart(7)}  ${p.ber.toExponential(3).padEnd(10)}  ${p.ser.toExponential(3).padEnd(10)}  ${`${p.bitErrors} / ${p.numBits}`.padEnd(18)}  ${theory}`,
        );
      }
      for (const w of wave.warnings) io.stderr(`warning: ${w}`);
    });
}
