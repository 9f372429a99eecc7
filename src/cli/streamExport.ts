import { runExport, type ExportResult, type ExportStep } from '../io/exportPipeline';
import type { ExportPlan } from '../io/exportPlan';
import { openAtomicStream } from './atomicWrite';
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
  const dataPath = `${base}${plan.format.dataSuffix}`;
  const metaPath = `${base}${plan.format.metaSuffix}`;
  const writer = openAtomicStream(dataPath);
  const steps = runExport(plan, { createHasher: createNodeSha512 });
  let lastYield = Date.now();
  let committed = false;
  try {
    for (;;) {
      if (options.signal?.aborted) throw new ExportCancelledError(`cancelled: ${dataPath} was not written (temporary file removed).`);
      const step = steps.next();
      if (step.done) {
        writer.commit([{ path: metaPath, bytes: step.value.metaText }]);
        committed = true;
        return { ...step.value, dataPath, metaPath };
      }
      if (step.value.kind === 'data') writer.write(step.value.bytes);
      else options.onProgress?.(step.value);
      if (Date.now() - lastYield > 50) {
        await new Promise<void>((resolve) => setImmediate(resolve));
        lastYield = Date.now();
      }
    }
  } finally {
    if (!committed) {
      steps.return(undefined as never);
      writer.abort();
    }
  }
}
