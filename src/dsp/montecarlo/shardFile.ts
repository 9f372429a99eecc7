import { DspError } from '../errors';
import { parseJsonText } from '../jsonText';
import { createDbHistogram, PAPR_HISTOGRAM_SPEC, POWER_HISTOGRAM_SPEC, type DbHistogram, type DbHistogramSpec } from '../metrics/dbHistogram';
import type { BlockRecord, HistogramSet } from './blockMeasurer';
import { canonicalJson, type MeasurementContext } from './measurementContext';
import { shardBlockIndices, type ShardSpec } from './runPlan';
import { createRunStats, mergeRunStats, type RunStats } from './runStats';

/**
 * The JSON a shard (`crestline measure --shard k/n --out FILE`) writes and `crestline merge` reads:
 *   { format: "crestline-measure-shard", version: 1, context, shard: {index, count},
 *     blocks: [BlockRecord…], histograms: { paprRunMean | paprSymbolMean | power: {minCentiDb, maxCentiDb, offset, counts} } }
 * Histogram counts are whole numbers, stored from the first to the last non-zero entry of the counts array
 * (`offset` = index of the first). Every number is written by JSON.stringify, whose shortest round-trip form
 * reads back to the same double, so merged results are bit-identical to a single run.
 */
export const SHARD_FORMAT = 'crestline-measure-shard';
/** Version of the shard JSON layout; `merge` reads only this version. */
export const SHARD_FORMAT_VERSION = 1;

/** A parsed shard: its context, which shard it is, and its counts. */
export interface ShardFile {
  readonly context: MeasurementContext;
  readonly shard: ShardSpec;
  readonly stats: RunStats;
}

interface SparseCounts {
  minCentiDb: number;
  maxCentiDb: number;
  offset: number;
  counts: number[];
}

const HISTOGRAM_KEYS: readonly (keyof HistogramSet)[] = ['paprRunMean', 'paprSymbolMean', 'power'];
const SPECS: Record<keyof HistogramSet, DbHistogramSpec> = { paprRunMean: PAPR_HISTOGRAM_SPEC, paprSymbolMean: PAPR_HISTOGRAM_SPEC, power: POWER_HISTOGRAM_SPEC };
const RECORD_FIELDS: readonly (keyof BlockRecord)[] = ['blockIndex', 'numSymbols', 'sumPower', 'sumPowerCubed', 'peakPower', 'maxPaprSymbolMean'];

/** The shard file's JSON text. */
export function serializeShardFile(file: ShardFile): string {
  const blocks = [...file.stats.records.values()].sort((a, b) => a.blockIndex - b.blockIndex);
  const histograms = Object.fromEntries(HISTOGRAM_KEYS.map((k) => [k, toSparse(file.stats.histograms[k])]));
  return `${JSON.stringify({ format: SHARD_FORMAT, version: SHARD_FORMAT_VERSION, context: file.context, shard: file.shard, blocks, histograms })}\n`;
}

/**
 * Reads a shard file's JSON text, checking its structure and that its blocks are exactly its shard's blocks.
 * @param sourceName names the file in error messages
 * @throws DspError INVALID_FILE naming the file and what is wrong
 */
export function parseShardFile(text: string, sourceName: string): ShardFile {
  const fail = (what: string): never => {
    throw new DspError('INVALID_FILE', `${sourceName}: ${what}`);
  };
  const o = parseJsonText(text, sourceName, 'INVALID_FILE') as Record<string, unknown>;
  if (!o || typeof o !== 'object' || o.format !== SHARD_FORMAT) return fail(`not a Crestline shard result (expected "format": "${SHARD_FORMAT}").`);
  if (o.version !== SHARD_FORMAT_VERSION) return fail(`shard format version ${String(o.version)} is not supported (this build reads version ${SHARD_FORMAT_VERSION}).`);
  const context = o.context as MeasurementContext;
  if (!context || typeof context !== 'object' || !context.identity?.run || !context.statistics) return fail('the "context" object is missing or incomplete.');
  const shard = o.shard as ShardSpec;
  if (!shard || !Number.isInteger(shard.index) || !Number.isInteger(shard.count)) return fail('"shard" must hold whole numbers index and count.');
  let expected: number[];
  try {
    expected = shardBlockIndices(context.identity.run, shard);
  } catch (err) {
    return fail((err as Error).message);
  }
  const stats = createRunStats();
  if (!Array.isArray(o.blocks)) return fail('"blocks" must be an array of block records.');
  for (const raw of o.blocks as Record<string, unknown>[]) {
    for (const f of RECORD_FIELDS) if (typeof raw?.[f] !== 'number' || !Number.isFinite(raw[f])) fail(`a block record lacks a finite "${f}".`);
    if (stats.records.has(raw.blockIndex as number)) fail(`block ${String(raw.blockIndex)} is listed twice.`);
    stats.records.set(raw.blockIndex as number, raw as unknown as BlockRecord);
  }
  const missing = expected.filter((b) => !stats.records.has(b));
  const extra = [...stats.records.keys()].filter((b) => b < expected[0]! || b > expected[expected.length - 1]!);
  if (missing.length > 0 || extra.length > 0 || stats.records.size !== expected.length) {
    fail(`shard ${shard.index}/${shard.count} should hold blocks ${expected[0]}…${expected[expected.length - 1]}; ${missing.length} missing, ${extra.length} foreign. The file is incomplete or was edited.`);
  }
  const histograms = o.histograms as Record<string, SparseCounts> | undefined;
  if (!histograms || typeof histograms !== 'object') return fail('"histograms" is missing.');
  for (const key of HISTOGRAM_KEYS) fromSparse(histograms[key], SPECS[key], stats.histograms[key], `histogram "${key}"`, fail);
  return { context, shard, stats };
}

/**
 * Merges the shards of one run. Every shard 1…n must be present exactly once and all must describe the same run
 * (configuration, oversampling, precision, seed, block size, symbols).
 * @param files parsed shard files with the names they came from
 * @returns the context of shard 1 (which holds the spectrum) and the merged counts
 * @throws DspError INVALID_FILE naming the offending file
 */
export function mergeShardFiles(files: readonly { name: string; file: ShardFile }[]): { context: MeasurementContext; stats: RunStats } {
  if (files.length === 0) throw new DspError('INVALID_FILE', 'merge needs at least one shard file.');
  const first = files[0]!;
  const identity = canonicalJson(first.file.context.identity);
  const count = first.file.shard.count;
  const seen = new Map<number, string>();
  const stats = createRunStats();
  for (const { name, file } of files) {
    if (canonicalJson(file.context.identity) !== identity) {
      throw new DspError('INVALID_FILE', `${name} belongs to a different run than ${first.name} (configuration, oversampling, precision, seed, block size or symbols differ).`);
    }
    if (file.shard.count !== count) throw new DspError('INVALID_FILE', `${name} is shard ${file.shard.index}/${file.shard.count}, but ${first.name} is one of ${count}.`);
    const previous = seen.get(file.shard.index);
    if (previous) throw new DspError('INVALID_FILE', `${name} and ${previous} are both shard ${file.shard.index}/${count}.`);
    seen.set(file.shard.index, name);
    mergeRunStats(stats, file.stats);
  }
  const absent = Array.from({ length: count }, (_, i) => i + 1).filter((k) => !seen.has(k));
  if (absent.length > 0) throw new DspError('INVALID_FILE', `Shard${absent.length > 1 ? 's' : ''} ${absent.map((k) => `${k}/${count}`).join(', ')} missing; merge needs all ${count}.`);
  const withSpectrum = files.find((f) => f.file.shard.index === 1)!;
  const merged = withSpectrum.file.context;
  const warnings = [...new Set(files.flatMap((f) => f.file.context.warnings))];
  return { context: { ...merged, warnings }, stats };
}

function toSparse(h: DbHistogram): SparseCounts {
  let first = 0;
  while (first < h.counts.length && h.counts[first] === 0) first++;
  let last = h.counts.length - 1;
  while (last >= first && h.counts[last] === 0) last--;
  return { minCentiDb: h.minCentiDb, maxCentiDb: h.maxCentiDb, offset: first, counts: Array.from(h.counts.subarray(first, last + 1)) };
}

function fromSparse(raw: SparseCounts | undefined, spec: DbHistogramSpec, into: DbHistogram, what: string, fail: (w: string) => never): void {
  if (!raw || raw.minCentiDb !== spec.minCentiDb || raw.maxCentiDb !== spec.maxCentiDb) {
    fail(`${what} must span ${spec.minCentiDb}…${spec.maxCentiDb} hundredths of a dB.`);
  }
  const target = createDbHistogram(spec);
  if (!Number.isInteger(raw!.offset) || !Array.isArray(raw!.counts) || raw!.offset < 0 || raw!.offset + raw!.counts.length > target.counts.length) {
    fail(`${what} has an offset or length outside its ${target.counts.length} bins.`);
  }
  raw!.counts.forEach((c, i) => {
    if (!Number.isSafeInteger(c) || c < 0) fail(`${what} holds a count that is not a whole number ≥ 0 (${String(c)}).`);
    into.counts[raw!.offset + i] = c;
  });
}
