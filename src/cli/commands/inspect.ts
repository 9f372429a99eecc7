import type { Command } from 'commander';
import { DspError } from '../../dsp/errors';
import type { CliIo } from '../main';
import { BARE_RAW_FORMATS, readIqFile } from '../readIqFile';

interface InspectFlags {
  ignoreChecksum?: boolean;
  rawFormat?: string;
  rate?: string;
  json?: boolean;
}

/**
 * `crestline inspect FILE`: validates an IQ file (SigMF, raw with sidecar, WAV, CSV) and prints its format, rate,
 * duration, samples, RMS/peak dBFS, crest factor, a power CCDF summary and, when our namespace is present, the
 * configuration it was generated from.
 */
export function registerInspect(program: Command, io: CliIo): void {
  program
    .command('inspect')
    .description('check an IQ file and print what it holds (format, rate, level, CCDF, generating configuration)')
    .argument('<file>', '.sigmf-meta/.sigmf-data, .wav, .csv, or .iq (with its .iq.json sidecar)')
    .option('--ignore-checksum', 'report a SHA-512 mismatch as a warning instead of an error')
    .option('--raw-format <format>', `raw file without sidecar: ${Object.keys(BARE_RAW_FORMATS).join('|')}`)
    .option('--rate <Hz>', 'raw file without sidecar: sample rate')
    .option('--json', 'print the summary as JSON')
    .action((file: string, flags: InspectFlags) => {
      let rateHz: number | undefined;
      if (flags.rate !== undefined) {
        rateHz = Number(flags.rate);
        if (!Number.isFinite(rateHz)) throw new DspError('INVALID_CONFIG', `--rate "${flags.rate}" is not a number.`, { field: 'rate' });
      }
      const { source, result } = readIqFile(file, { ignoreChecksum: flags.ignoreChecksum, rawFormat: flags.rawFormat, rateHz });
      const s = result.summary;
      const rate = source.sampleRateHz;
      const scaling = source.crestline.scaling as Record<string, unknown> | undefined;
      if (flags.json) {
        io.stdout(
          JSON.stringify(
            {
              file,
              data: source.dataName,
              metadata: source.metaName ?? null,
              format: source.formatLabel,
              datatype: source.datatype,
              sampleRateHz: rate ?? null,
              numSamples: result.numSamples,
              durationS: rate ? result.numSamples / rate : null,
              checksum: result.checksum,
              sha512: result.sha512Hex,
              rmsDbfs: s.rmsDb,
              peakDbfs: s.peakDb,
              peakComponentDbfs: s.peakComponentDb,
              crestFactorDb: s.crestFactorDb,
              ccdf: s.ccdf,
              fullScaleSamples: result.fullScaleSamples ?? null,
              centerFrequencyHz: source.centerFrequencyHz ?? null,
              crestline: source.crestline,
              warnings: result.warnings,
            },
            null,
            2,
          ),
        );
        return;
      }
      const line = (k: string, v: string): void => io.stdout(`${k.padEnd(14)}${v}`);
      line('file', source.metaName ? `${source.dataName} (metadata ${source.metaName})` : source.dataName);
      line('format', source.formatLabel);
      line('sample rate', rate ? `${(rate / 1e6).toFixed(6)} Msps (${rate} Hz)` : 'not given');
      line('samples', `${result.numSamples}${rate ? `, ${((result.numSamples / rate) * 1e3).toFixed(6)} ms` : ''}`);
      if (source.centerFrequencyHz !== undefined) line('centre freq', `${(source.centerFrequencyHz / 1e6).toFixed(6)} MHz`);
      line('checksum', result.checksum === 'verified' ? 'SHA-512 verified' : result.checksum === 'absent' ? 'no SHA-512 in the metadata' : 'SHA-512 MISMATCH (ignored on request)');
      if (result.numSamples === 0) {
        line('level', 'no samples');
      } else {
        line('level', `RMS ${s.rmsDb.toFixed(2)} dBFS, peak ${s.peakDb.toFixed(2)} dBFS (largest I/Q ${s.peakComponentDb.toFixed(2)} dBFS), crest factor ${s.crestFactorDb.toFixed(2)} dB`);
        line('power CCDF', 'dB above mean power exceeded by a fraction of samples:');
        for (const p of s.ccdf) {
          if (p.probability * result.numSamples < 1) continue;
          io.stdout(`${''.padEnd(14)}${p.probability.toExponential(0).padStart(6)}  ${p.levelDb.toFixed(2).padStart(6)} dB${p.reliable ? '' : '  (few samples: near the peak)'}`);
        }
      }
      if (result.fullScaleSamples !== undefined) {
        line('full scale', `${result.fullScaleSamples} samples with I or Q at the extreme code (${((100 * result.fullScaleSamples) / Math.max(1, result.numSamples)).toPrecision(3)} %; clipped if above 0)`);
      }
      if (source.description) line('description', source.description);
      if (scaling) {
        const parts = [`mode ${String(scaling.levelMode ?? 'formula')}`, `scale ${String(scaling.scaleLinear)}`];
        const q = scaling.quantisation as Record<string, number> | undefined;
        if (q) parts.push(`clipped ${q.clippedSamples} (${Number(q.clippedPercent).toPrecision(3)} %)`, `quantisation SNR ${Number(q.quantisationSnrDb).toFixed(1)} dB`);
        line('scaling', parts.join(', '));
      }
      const exp = source.crestline.export as Record<string, unknown> | undefined;
      if (exp && typeof exp.resampler === 'object' && exp.resampler) {
        const r = exp.resampler as Record<string, number>;
        line('resampled', `${Number(exp.nativeSampleRateHz) / 1e6} → ${Number(exp.sampleRateHz) / 1e6} Msps (${r.up}/${r.down}, ${r.numTaps} taps, ripple ${Number(r.measuredPassbandRippleDb).toFixed(4)} dB, attenuation ${Number(r.measuredStopbandAttenuationDb).toFixed(1)} dB)`);
      }
      if (source.crestline.config !== undefined) {
        io.stdout('configuration (crestline namespace):');
        io.stdout(JSON.stringify(source.crestline.config, null, 2));
      }
      for (const w of result.warnings) io.stderr(`warning: ${w}`);
    });
}
