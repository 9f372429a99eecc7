import type { Command } from 'commander';
import { analyzeBackoff, type BackoffAnalysis } from '../../dsp/backoff/backoffAnalysis';
import { MAX_SYMBOLS, type WaveformConfig } from '../../config/schema';
import { DspError } from '../../dsp/errors';
import { describeConfig } from '../../dsp/waveform/configDescription';
import type { CliIo } from '../main';
import { readConfigFile } from '../readConfig';
import { backoffJson, backoffText } from './backoffReport';
import { amplifierFromOptions, optionalNumber, parseAclrLimit, type PaOptions } from './paModelOption';

interface BackoffOptions extends PaOptions {
  readonly config: string;
  readonly compare?: string;
  readonly axis?: string;
  readonly from?: string;
  readonly to?: string;
  readonly step?: string;
  readonly tolerance?: string;
  readonly evmLimit?: string;
  readonly aclrLimit?: string;
  readonly psatDbm?: string;
  readonly rbwKhz?: string;
  readonly symbols?: string;
  readonly json?: boolean;
}

/**
 * `crestline backoff --config cfg.json --pa rapp|saleh|clip|table:FILE …`: sweeps the amplifier's back-off, measures
 * EVM and ACLR at each point and prints the least back-off that meets the limits, the usable output power and the
 * standard's MPR allowance; with --compare, the same for a second configuration and the power difference.
 */
export function registerBackoff(program: Command, io: CliIo): void {
  program
    .command('backoff')
    .description('find the least PA back-off meeting EVM and ACLR limits, and the output power it leaves')
    .requiredOption('--config <file>', 'waveform configuration (JSON)')
    .option('--pa <model>', 'rapp | saleh | clip | table:FILE (CSV: input dBm/dBFS, gain dB, phase deg); default: the configuration\'s amplifier')
    .option('--smoothness <p>', 'Rapp smoothness p (default 2)')
    .option('--gain-db <dB>', 'Rapp / clip small-signal gain (default 0)')
    .option('--sat-amplitude <A>', 'Rapp / clip output saturation amplitude (default 1)')
    .option('--am-pm <a,b,q>', 'Rapp AM/PM Φ = a·r^q/(1 + (r/b)^q) degrees')
    .option('--saleh <aa,ba,ap,bp>', 'Saleh α_a, β_a, α_φ, β_φ (default the TWT preset 2.1587,1.1517,4.0033,9.1040)')
    .option('--table-unit <unit>', 'input unit of a headerless table: dBm or dBFS')
    .option('--axis <obo|ibo>', 'sweep output (default) or input back-off')
    .option('--symbols <n>', 'OFDM symbols analysed (default: the configuration\'s; ≥ 56 gives steadier ACLR)')
    .option('--from <dB>', 'lowest back-off swept (default 1)')
    .option('--to <dB>', 'highest back-off swept (default 15)')
    .option('--step <dB>', 'sweep step (default 1)')
    .option('--tolerance <dB>', 'bisection stops below this bracket (default 0.05)')
    .option('--evm-limit <percent>', 'EVM budget (default: the standard\'s limit for the modulation)')
    .option('--aclr-limit <dB|key=dB,…>', 'ACLR limit for every adjacent channel, or per channel (default: the standard\'s)')
    .option('--psat-dbm <dBm>', 'PA saturated output power, for absolute output powers (a dBm table gives its own)')
    .option('--rbw-khz <kHz>', 'Welch RBW for ACLR (default channel BW / 200)')
    .option('--compare <file>', 'second configuration: same amplifier and limits, and the power difference')
    .option('--json', 'print JSON')
    .action((opts: BackoffOptions) => {
      const config = readConfigFile(opts.config);
      const { model, tablePsatDbm } = amplifierFromOptions(opts, config.amplifier);
      const axis = opts.axis ?? 'obo';
      if (axis !== 'obo' && axis !== 'ibo') throw new DspError('INVALID_CONFIG', `--axis must be obo or ibo; got "${axis}".`, { field: '--axis' });
      const psatDbm = optionalNumber(opts.psatDbm, '--psat-dbm') ?? tablePsatDbm;
      const rbwKhz = optionalNumber(opts.rbwKhz, '--rbw-khz');
      const evmLimitPercent = optionalNumber(opts.evmLimit, '--evm-limit');
      if (evmLimitPercent !== undefined && !(evmLimitPercent > 0)) throw new DspError('INVALID_CONFIG', `--evm-limit must be a positive percentage; got ${evmLimitPercent}.`);
      const aclrLimitDb = parseAclrLimit(opts.aclrLimit);
      const symbols = optionalNumber(opts.symbols, '--symbols');
      if (symbols !== undefined && !(Number.isInteger(symbols) && symbols >= 1 && symbols <= MAX_SYMBOLS)) {
        throw new DspError('INVALID_CONFIG', `--symbols must be a whole number from 1 to ${MAX_SYMBOLS}; got ${symbols}.`, { field: '--symbols' });
      }
      const withSymbols = (cfg: WaveformConfig): WaveformConfig => (symbols !== undefined ? { ...cfg, symbols } : cfg);
      const analyze = (path: string, cfg = readConfigFile(path)): BackoffAnalysis =>
        analyzeBackoff(withSymbols(cfg), {
          model,
          axis,
          fromDb: optionalNumber(opts.from, '--from') ?? 1,
          toDb: optionalNumber(opts.to, '--to') ?? 15,
          stepDb: optionalNumber(opts.step, '--step') ?? 1,
          toleranceDb: optionalNumber(opts.tolerance, '--tolerance') ?? 0.05,
          ...(evmLimitPercent !== undefined ? { evmLimitPercent } : {}),
          ...(aclrLimitDb !== undefined ? { aclrLimitDb } : {}),
          ...(psatDbm !== undefined ? { psatDbm } : {}),
          ...(rbwKhz !== undefined ? { rbwHz: rbwKhz * 1e3 } : {}),
        });
      const first = analyze(opts.config, config);
      const firstName = describeConfig(withSymbols(config));
      const second = opts.compare !== undefined ? { cfg: withSymbols(readConfigFile(opts.compare)) } : undefined;
      const secondAnalysis = second ? analyze(opts.compare!, second.cfg) : undefined;
      const difference =
        secondAnalysis && first.requiredOboDb !== null && secondAnalysis.requiredOboDb !== null
          ? { usablePowerDifferenceDb: secondAnalysis.requiredOboDb - first.requiredOboDb }
          : undefined;
      if (opts.json) {
        const out: Record<string, unknown> = backoffJson(first, firstName);
        if (secondAnalysis && second) {
          out.compare = {
            ...backoffJson(secondAnalysis, describeConfig(second.cfg)),
            // First minus second: how much more mean power the first configuration can transmit.
            usablePowerDifferenceDb: difference ? Math.round(difference.usablePowerDifferenceDb * 1e4) / 1e4 : null,
          };
        }
        io.stdout(JSON.stringify(out, null, 2));
        return;
      }
      for (const line of backoffText(first, firstName)) io.stdout(line);
      if (secondAnalysis && second) {
        io.stdout('');
        for (const line of backoffText(secondAnalysis, describeConfig(second.cfg))) io.stdout(line);
        io.stdout('');
        io.stdout(
          difference
            ? `difference: with this amplifier and these limits the first configuration can transmit ${difference.usablePowerDifferenceDb.toFixed(2)} dB ${difference.usablePowerDifferenceDb >= 0 ? 'more' : 'less'} mean power than the second (back-off ${first.requiredOboDb!.toFixed(2)} vs ${secondAnalysis.requiredOboDb!.toFixed(2)} dB)`
            : 'difference: not available (one of the sweeps did not reach an answer)',
        );
      }
    });
}
