import { DspError } from '../dsp/errors';
import { parseJsonText } from '../dsp/jsonText';
import { isIqDatatype, READABLE_DATATYPES, type IqDatatype } from './iqDatatypes';

/**
 * SigMF metadata (Signal Metadata Format specification v1.2.x; field list in REFERENCE §9, schema sigmf-schema.json):
 * building the `.sigmf-meta` object Crestline writes, and reading one back with validation.
 */

/** SigMF version written (the core fields used here are unchanged since 1.0). */
export const SIGMF_VERSION = '1.2.0';
/** Our own namespace for the generating configuration and scaling facts. */
export const CRESTLINE_NAMESPACE = 'crestline';
/** Version of the `crestline:` fields. */
export const CRESTLINE_NAMESPACE_VERSION = '1.1.0';
/** Largest `.sigmf-meta` read (64 MiB). */
export const MAX_META_BYTES = 64 << 20;

export interface SigmfAnnotation {
  readonly sampleStart: number;
  readonly sampleCount: number;
  readonly label: string;
  /** Both or neither (SigMF): RF when the capture has core:frequency, else baseband. */
  readonly freqLowerEdgeHz?: number | undefined;
  readonly freqUpperEdgeHz?: number | undefined;
}

export interface SigmfMetaInput {
  readonly datatype: 'cf32_le' | 'ci16_le' | 'ci8';
  readonly sampleRateHz: number;
  readonly sha512Hex: string;
  readonly description: string;
  readonly recorder: string;
  readonly author?: string | undefined;
  readonly centerFrequencyHz?: number | undefined;
  /** Fields of our namespace, without the prefix (config, num_samples, scaling, export…), in order. */
  readonly crestline: Readonly<Record<string, unknown>>;
  readonly annotations?: readonly SigmfAnnotation[] | undefined;
}

/**
 * Builds the `.sigmf-meta` object: global (core:datatype, core:sample_rate, core:version, core:sha512,
 * core:description, core:recorder, core:author when given, core:extensions, then `crestline:*`), one capture at sample
 * 0 (core:frequency when a carrier is set) and the annotations, in sample order.
 */
export function buildSigmfMeta(input: SigmfMetaInput): Record<string, unknown> {
  const global: Record<string, unknown> = {
    'core:datatype': input.datatype,
    'core:sample_rate': input.sampleRateHz,
    'core:version': SIGMF_VERSION,
    'core:sha512': input.sha512Hex,
    'core:description': input.description,
    'core:recorder': input.recorder,
    'core:num_channels': 1,
    'core:extensions': [{ name: CRESTLINE_NAMESPACE, version: CRESTLINE_NAMESPACE_VERSION, optional: true }],
  };
  for (const [key, value] of Object.entries(input.crestline)) global[`${CRESTLINE_NAMESPACE}:${key}`] = value;
  if (input.author !== undefined) global['core:author'] = input.author;
  const capture: Record<string, unknown> = { 'core:sample_start': 0 };
  if (input.centerFrequencyHz !== undefined) capture['core:frequency'] = input.centerFrequencyHz;
  const annotations = (input.annotations ?? []).map((a) => {
    const out: Record<string, unknown> = { 'core:sample_start': a.sampleStart, 'core:sample_count': a.sampleCount, 'core:label': a.label };
    if (a.freqLowerEdgeHz !== undefined && a.freqUpperEdgeHz !== undefined) {
      out['core:freq_lower_edge'] = a.freqLowerEdgeHz;
      out['core:freq_upper_edge'] = a.freqUpperEdgeHz;
    }
    return out;
  });
  return { global, captures: [capture], annotations };
}

/** What a `.sigmf-meta` says, checked. */
export interface SigmfDescriptor {
  readonly datatype: IqDatatype;
  readonly version: string;
  readonly sampleRateHz: number | undefined;
  readonly sha512Hex: string | undefined;
  readonly description: string | undefined;
  readonly author: string | undefined;
  readonly recorder: string | undefined;
  readonly centerFrequencyHz: number | undefined;
  readonly numAnnotations: number;
  /** `crestline:*` fields without the prefix (empty when the namespace is absent). */
  readonly crestline: Readonly<Record<string, unknown>>;
  readonly warnings: readonly string[];
}

/**
 * Parses and checks `.sigmf-meta` text: JSON, the three top-level keys and no others, a known core:datatype this
 * reader decodes, core:version, core:sample_rate positive and finite when present, core:sha512 128 hex digits, one
 * channel, a conforming dataset (no core:dataset, no header bytes).
 * @throws DspError INVALID_FILE naming `sourceName`; details.problem is "json", "structure", "datatype", "sample-rate",
 *   "checksum-field" or "unsupported"
 */
export function parseSigmfMeta(text: string, sourceName: string): SigmfDescriptor {
  const fail = (problem: string, message: string): never => {
    throw new DspError('INVALID_FILE', `${sourceName}: ${message}`, { problem });
  };
  const json = parseJsonText(text, sourceName, 'INVALID_FILE', { problem: 'json' });
  if (!isObject(json)) return fail('structure', 'the metadata must be a JSON object with "global", "captures" and "annotations".');
  for (const key of ['global', 'captures', 'annotations']) if (!(key in json)) fail('structure', `the required top-level key "${key}" is missing.`);
  const extra = Object.keys(json).filter((k) => !['global', 'captures', 'annotations'].includes(k));
  if (extra.length > 0) fail('structure', `unknown top-level key(s) ${extra.map((k) => `"${k}"`).join(', ')}; SigMF allows only global, captures and annotations.`);
  const global = json.global;
  if (!isObject(global)) return fail('structure', '"global" must be an object.');
  if (!Array.isArray(json.captures)) fail('structure', '"captures" must be an array.');
  if (!Array.isArray(json.annotations)) fail('structure', '"annotations" must be an array.');
  const datatype = global['core:datatype'];
  if (typeof datatype !== 'string') return fail('datatype', 'global "core:datatype" is missing or not a string.');
  if (!isIqDatatype(datatype) || datatype === 'ci16_be') {
    const known = /^(c|r)(f32|f64|i32|i16|u32|u16|i8|u8)(_le|_be)?$/.test(datatype);
    return fail(
      'datatype',
      `core:datatype "${datatype}" is ${known ? 'a SigMF datatype this reader does not decode' : 'not a SigMF datatype'}; supported: ${READABLE_DATATYPES.filter((d) => d !== 'ci16_be').join(', ')}.`,
    );
  }
  const version = global['core:version'];
  if (typeof version !== 'string' || !/^\d+\.\d+\.\d+/.test(version)) fail('structure', `global "core:version" must be a version "X.Y.Z"; got ${JSON.stringify(version)}.`);
  const rate = global['core:sample_rate'];
  if (rate !== undefined && !(typeof rate === 'number' && Number.isFinite(rate) && rate > 0)) {
    fail('sample-rate', `core:sample_rate must be a positive, finite number of samples per second; got ${JSON.stringify(rate)}.`);
  }
  const sha = global['core:sha512'];
  if (sha !== undefined && !(typeof sha === 'string' && /^[0-9a-fA-F]{128}$/.test(sha))) fail('checksum-field', 'core:sha512 must be 128 hexadecimal digits.');
  const channels = global['core:num_channels'];
  if (channels !== undefined && channels !== 1) fail('unsupported', `core:num_channels is ${JSON.stringify(channels)}; this reader handles one channel.`);
  if (global['core:dataset'] !== undefined) fail('unsupported', 'core:dataset names a non-conforming dataset, which this reader does not open.');
  const captures = json.captures as unknown[];
  if (captures.some((c) => isObject(c) && c['core:header_bytes'] !== undefined && c['core:header_bytes'] !== 0)) {
    fail('unsupported', 'a capture has core:header_bytes (a non-conforming dataset), which this reader does not open.');
  }
  const warnings: string[] = [];
  if (rate === undefined) warnings.push(`${sourceName}: no core:sample_rate; durations are not known.`);
  const first = captures[0];
  const freq = isObject(first) ? first['core:frequency'] : undefined;
  const crestline: Record<string, unknown> = {};
  for (const [k, v] of Object.entries(global)) if (k.startsWith(`${CRESTLINE_NAMESPACE}:`)) crestline[k.slice(CRESTLINE_NAMESPACE.length + 1)] = v;
  return {
    datatype,
    version: version as string,
    sampleRateHz: rate as number | undefined,
    sha512Hex: typeof sha === 'string' ? sha.toLowerCase() : undefined,
    description: stringOrUndefined(global['core:description']),
    author: stringOrUndefined(global['core:author']),
    recorder: stringOrUndefined(global['core:recorder']),
    centerFrequencyHz: typeof freq === 'number' && Number.isFinite(freq) ? freq : undefined,
    numAnnotations: (json.annotations as unknown[]).length,
    crestline,
    warnings,
  };
}

function isObject(v: unknown): v is Record<string, unknown> {
  return typeof v === 'object' && v !== null && !Array.isArray(v);
}

function stringOrUndefined(v: unknown): string | undefined {
  return typeof v === 'string' ? v : undefined;
}
