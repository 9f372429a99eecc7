import type { Command } from 'commander';
import { buildMeasureReport } from '../../dsp/montecarlo/measureReport';
import { mergeShardFiles, parseShardFile, serializeShardFile } from '../../dsp/montecarlo/shardFile';
import { writeFilesAtomically } from '../atomicWrite';
import type { CliIo } from '../main';
import { readTextFile } from '../readTextFile';
import { formatMeasureTable } from './measureFormat';
import { parseReportOptions, type ReportFlags } from './measureOptions';

interface MergeFlags extends ReportFlags {
  json?: boolean;
  out?: string;
}

/**
 * `crestline merge SHARD.json… [--json] [--out FILE]`: adds the counts of every shard of one run exactly and prints
 * the same report a single run would (bit-identical histograms, identical JSON).
 */
export function registerMerge(program: Command, io: CliIo): void {
  program
    .command('merge')
    .description('combine the shard files of one crestline measure run exactly and print its report')
    .argument('<files...>', 'shard files written by crestline measure --shard k/n --out FILE')
    .option('--papr-mean <run|symbol>', 'PAPR definition reported as paprDb', 'run')
    .option('--cm-slope <k>', 'cubic-metric slope k', '1.56')
    .option('--cm-round', 'round the cubic metric up to 0.5 dB as TS 25.101 does')
    .option('--full-scale <amplitude>', 'full-scale magnitude in sample units, for dBFS figures')
    .option('--out <file>', 'also write the merged counts as one shard file (1/1)')
    .option('--json', 'print one JSON object instead of the table')
    .action((paths: string[], flags: MergeFlags) => {
      const reportOptions = parseReportOptions(flags);
      const files = paths.map((path) => {
        const text = readTextFile(path, 'shard file', 'INVALID_FILE');
        return { name: path, file: parseShardFile(text, path) };
      });
      const { context, stats } = mergeShardFiles(files);
      if (flags.out !== undefined) writeFilesAtomically([{ path: flags.out, bytes: serializeShardFile({ context, shard: { index: 1, count: 1 }, stats }) }]);
      const report = buildMeasureReport(context, stats, reportOptions);
      if (flags.json) io.stdout(JSON.stringify(report, null, 2));
      else for (const line of formatMeasureTable(report)) io.stdout(line);
    });
}
