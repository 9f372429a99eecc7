import { createHash } from 'node:crypto';
import type { Command } from 'commander';
import { buildSigmfMeta } from '../../io/sigmfMeta';
import { encodeCf32Le } from '../../io/cf32';
import { generateWaveform } from '../../dsp/waveform/waveformGenerator';
import { effectiveWaveform } from '../../dsp/waveform/waveformPlan';
import { writeFilesAtomically } from '../atomicWrite';
import type { CliIo } from '../main';
import { readConfigFile } from '../readConfig';
import type { WaveformConfig } from '../../config/schema';

/** One-line description of a configuration, for file metadata and summaries. */
export function describeConfig(config: WaveformConfig): string {
  const waveform = effectiveWaveform(config);
  const scs = config.standard === 'nr' ? ` ${config.subcarrierSpacingKHz ?? 30} kHz` : '';
  return `${config.standard.toUpperCase()} ${config.bandwidthMHz} MHz${scs} ${config.link} ${waveform} ${config.modulation}, ${config.symbols} symbols, oversampling ${config.oversampling}`;
}

/** `crestline generate --config cfg.json --out BASE`: writes BASE.sigmf-meta and BASE.sigmf-data (cf32_le). */
export function registerGenerate(program: Command, io: CliIo): void {
  program
    .command('generate')
    .description('generate a configured waveform and write it as a SigMF recording (cf32_le)')
    .requiredOption('--config <file>', 'waveform configuration (JSON)')
    .requiredOption('--out <base>', 'output base name: writes BASE.sigmf-meta and BASE.sigmf-data')
    .action((opts: { config: string; out: string }) => {
      const config = readConfigFile(opts.config);
      const wave = generateWaveform(config);
      const data = encodeCf32Le(wave.waveformIq);
      const sha512Hex = createHash('sha512').update(data).digest('hex');
      let power = 0;
      for (let i = 0; i < wave.waveformIq.length; i++) power += wave.waveformIq[i]! ** 2;
      const meanPower = power / wave.numSamples;
      const meta = buildSigmfMeta({
        datatype: 'cf32_le',
        sampleRateHz: wave.sampleRateHz,
        sha512Hex,
        description: `Crestline waveform: ${describeConfig(config)}`,
        recorder: 'crestline generate',
        config,
        numSamples: wave.numSamples,
        centerFrequencyHz: config.carrierFrequencyHz,
        scaling: { scaleLinear: 1, note: 'samples are the standard baseband formula values, unscaled', meanPowerLinear: meanPower },
      });
      writeFilesAtomically([
        { path: `${opts.out}.sigmf-data`, bytes: data },
        { path: `${opts.out}.sigmf-meta`, bytes: `${JSON.stringify(meta, null, 2)}\n` },
      ]);
      for (const w of wave.warnings) io.stderr(`warning: ${w}`);
      const durationS = wave.numSamples / wave.sampleRateHz;
      io.stdout(
        `wrote ${opts.out}.sigmf-data: ${wave.numSamples} samples, ${(durationS * 1e3).toFixed(3)} ms at ${(wave.sampleRateHz / 1e6).toFixed(3)} Msps, mean power ${(10 * Math.log10(meanPower)).toFixed(2)} dB (re 1, unscaled formula)`,
      );
    });
}
