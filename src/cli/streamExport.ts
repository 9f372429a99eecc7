import { basename } from 'node:path';
import { DspError } from '../dsp/errors';
import { runExport, type ExportResult, type ExportStep } from '../io/exportPipeline';
import type { ExportPlan } from '../io/exportPlan';
import { sigmfArchiveNames } from '../io/sigmfArchive';
import { encodeUstarHeader, ustarEndBlocks, ustarPaddingBytes } from '../io/ustar';
import { openAtomicStream, type AtomicStreamWriter } from './atomicWrite';
import { createNodeSha512 } from './nodeHash';

/** Thrown when an export is cancelled (SIGINT or an aborted signal); nothing was left under a final name. */
export class ExportCancelledError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'ExportCancelledError';
  }
}

export interface StreamExportOptions {
  readonly signal?: AbortSignal | undefined;
  readonly onProgress?: ((step: Extract<ExportStep, { kind: 'progress' }>) => void) | undefined;
}

/**
 * Streams an export to `base + suffix` files: the data chunk by chunk to a temporary name, the metadata at the end,
 * both renamed only when complete. Returns to the event loop every ~50 ms so SIGINT can cancel; on cancel or any
 * error the temporaries are removed and no file with a final name exists.
 */
export async function streamExportToFiles(plan: ExportPlan, base: string, options: StreamExportOptions = {}): Promise<ExportResult & { dataPath: string; metaPath: string }> {
  if (plan.format.archiveSuffix !== undefined) return streamArchive(plan, base, options);
  const dataPath = `${base}${plan.format.dataSuffix}`;
  const metaPath = `${base}${plan.format.metaSuffix}`;
  const writer = openAtomicStream(dataPath);
  try {
    const result = await pumpExport(plan, dataPath, (bytes) => writer.write(bytes), options);
    writer.commit([{ path: metaPath, bytes: result.metaText }]);
    return { ...result, dataPath, metaPath };
  } catch (err) {
    writer.abort();
    throw err;
  }
}

/**
 * A SigMF archive (`BASE.sigmf`) streamed as one tar file under a temporary name: the directory `N/`, the data member
 * `N/N.sigmf-data` (its size is known from the plan before the first sample), then `N/N.sigmf-meta` once the SHA-512 is
 * known, then the end blocks; renamed only when complete, removed on cancel or error.
 */
async function streamArchive(plan: ExportPlan, base: string, options: StreamExportOptions): Promise<ExportResult & { dataPath: string; metaPath: string }> {
  const archivePath = `${base}${plan.format.archiveSuffix}`;
  const names = sigmfArchiveNames(basename(base));
  const dataBytes = plan.dataFileBytes;
  if (dataBytes === undefined) throw new DspError('INTERNAL', `${plan.format.format}: the data size must be known before an archive is written.`);
  const mtimeS = Math.floor(Date.now() / 1000);
  const writer: AtomicStreamWriter = openAtomicStream(archivePath);
  try {
    writer.write(encodeUstarHeader({ name: names.directory, type: 'directory', sizeBytes: 0, mtimeS }));
    writer.write(encodeUstarHeader({ name: names.data, type: 'file', sizeBytes: dataBytes, mtimeS }));
    const result = await pumpExport(plan, archivePath, (bytes) => writer.write(bytes), options);
    // runExport checks the bytes it produced against plan.dataFileBytes, so the data member's size holds.
    const meta = new TextEncoder().encode(result.metaText);
    writer.write(new Uint8Array(ustarPaddingBytes(dataBytes)));
    writer.write(encodeUstarHeader({ name: names.meta, type: 'file', sizeBytes: meta.length, mtimeS }));
    writer.write(meta);
    writer.write(new Uint8Array(ustarPaddingBytes(meta.length)));
    writer.write(ustarEndBlocks());
    writer.commit([]);
    return { ...result, dataPath: archivePath, metaPath: `${archivePath}: ${names.meta} (data ${names.data})` };
  } catch (err) {
    writer.abort();
    throw err;
  }
}

/** Runs the export, handing data to `write`; yields to the event loop every ~50 ms so SIGINT can cancel. */
async function pumpExport(plan: ExportPlan, targetPath: string, write: (bytes: Uint8Array) => void, options: StreamExportOptions): Promise<ExportResult> {
  const steps = runExport(plan, { createHasher: createNodeSha512 });
  let lastYield = Date.now();
  let finished = false;
  try {
    for (;;) {
      if (options.signal?.aborted) throw new ExportCancelledError(`cancelled: ${targetPath} was not written (temporary file removed).`);
      const step = steps.next();
      if (step.done) {
        finished = true;
        return step.value;
      }
      if (step.value.kind === 'data') write(step.value.bytes);
      else options.onProgress?.(step.value);
      if (Date.now() - lastYield > 50) {
        await new Promise<void>((resolve) => setImmediate(resolve));
        lastYield = Date.now();
      }
    }
  } finally {
    if (!finished) steps.return(undefined as never);
  }
}
