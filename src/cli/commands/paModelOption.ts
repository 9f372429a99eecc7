import type { AmplifierConfig } from '../../config/transmitterSchema';
import type { AmplifierModel } from '../../dsp/amplifier/amplifierModel';
import { createTableModel, tableSaturatedOutputDbm } from '../../dsp/amplifier/amAmTable';
import { parseAmAmTableCsv } from '../../dsp/amplifier/amAmTableCsv';
import { createAmplifierFromConfig } from '../../dsp/amplifier/createAmplifier';
import { createRappModel } from '../../dsp/amplifier/rapp';
import { createSalehModel, SALEH_TWT_PRESET } from '../../dsp/amplifier/saleh';
import { createSoftLimiterModel } from '../../dsp/amplifier/softLimiter';
import { DspError } from '../../dsp/errors';
import { readTextFile } from '../readTextFile';

/** Command-line amplifier options of `crestline backoff`. */
export interface PaOptions {
  readonly pa?: string;
  readonly smoothness?: string;
  readonly gainDb?: string;
  readonly satAmplitude?: string;
  readonly amPm?: string;
  readonly saleh?: string;
  readonly tableUnit?: string;
}

/** The amplifier `--pa` names (or the configuration's own `amplifier` when --pa is absent), and its P_sat from a dBm table. */
export function amplifierFromOptions(opts: PaOptions, configAmplifier: AmplifierConfig | undefined): { model: AmplifierModel; tablePsatDbm?: number } {
  const pa = opts.pa;
  if (pa === undefined) {
    if (configAmplifier) return { model: createAmplifierFromConfig(configAmplifier) };
    throw new DspError('INVALID_CONFIG', '--pa is required (rapp, saleh, clip or table:FILE) unless the configuration has an "amplifier" object.', { field: '--pa' });
  }
  const gainDb = optionalNumber(opts.gainDb, '--gain-db');
  const sat = optionalNumber(opts.satAmplitude, '--sat-amplitude');
  if (pa === 'rapp') {
    const amPm = opts.amPm === undefined ? undefined : numberList(opts.amPm, '--am-pm', 3);
    return {
      model: createRappModel({
        smoothness: optionalNumber(opts.smoothness, '--smoothness') ?? 2,
        ...(gainDb !== undefined ? { gainDb } : {}),
        ...(sat !== undefined ? { outputSaturationAmplitude: sat } : {}),
        ...(amPm ? { amPm: { alphaDeg: amPm[0]!, betaAmplitude: amPm[1]!, exponent: amPm[2]! } } : {}),
      }),
    };
  }
  if (pa === 'saleh') {
    const p = opts.saleh === undefined ? undefined : numberList(opts.saleh, '--saleh', 4);
    return { model: createSalehModel(p ? { alphaA: p[0]!, betaA: p[1]!, alphaPhi: p[2]!, betaPhi: p[3]! } : SALEH_TWT_PRESET) };
  }
  if (pa === 'clip') {
    return { model: createSoftLimiterModel({ ...(gainDb !== undefined ? { gainDb } : {}), ...(sat !== undefined ? { outputSaturationAmplitude: sat } : {}) }) };
  }
  if (pa.startsWith('table:')) {
    const path = pa.slice('table:'.length);
    const text = readTextFile(path, 'the AM/AM table', 'INVALID_FILE');
    const unit = opts.tableUnit;
    if (unit !== undefined && unit !== 'dBm' && unit !== 'dBFS') {
      throw new DspError('INVALID_CONFIG', `--table-unit must be dBm or dBFS; got "${unit}".`, { field: '--table-unit' });
    }
    const table = parseAmAmTableCsv(text, { sourceName: path, ...(unit ? { inputUnit: unit } : {}) });
    const psat = tableSaturatedOutputDbm(table);
    return { model: createTableModel(table, path), ...(psat !== undefined ? { tablePsatDbm: psat } : {}) };
  }
  throw new DspError('INVALID_CONFIG', `--pa "${pa}" is not known; use rapp, saleh, clip or table:FILE.`, { field: '--pa' });
}

/** Parses an optional numeric option; throws naming the option. */
export function optionalNumber(value: string | undefined, name: string): number | undefined {
  if (value === undefined) return undefined;
  const n = Number(value);
  if (value.trim() === '' || !Number.isFinite(n)) throw new DspError('INVALID_CONFIG', `${name} must be a number; got "${value}".`, { field: name });
  return n;
}

function numberList(value: string, name: string, count: number): number[] {
  const parts = value.split(',').map((p) => Number(p.trim()));
  if (parts.length !== count || parts.some((p) => !Number.isFinite(p))) {
    throw new DspError('INVALID_CONFIG', `${name} takes ${count} comma-separated numbers; got "${value}".`, { field: name });
  }
  return parts;
}

/** `--aclr-limit 30` (every channel) or `--aclr-limit eutraLower=30,utra1Upper=33`. */
export function parseAclrLimit(value: string | undefined): number | Record<string, number> | undefined {
  if (value === undefined) return undefined;
  if (!value.includes('=')) return optionalNumber(value, '--aclr-limit');
  const out: Record<string, number> = {};
  for (const part of value.split(',')) {
    const [key, v] = part.split('=').map((s) => s.trim());
    const n = Number(v);
    if (!key || v === undefined || !Number.isFinite(n)) {
      throw new DspError('INVALID_CONFIG', `--aclr-limit: "${part}" is not channel=dB (e.g. utra1Upper=33).`, { field: '--aclr-limit' });
    }
    out[key] = n;
  }
  return out;
}
