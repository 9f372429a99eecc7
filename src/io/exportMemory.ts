import { DspError } from '../dsp/errors';
import type { WaveformConfig } from '../config/schema';
import type { ExportOptionsInput } from './exportOptions';
import { runExport, type ExportHooks, type ExportResult } from './exportPipeline';
import { planExport } from './exportPlan';

/** Largest export assembled in memory (the browser's download path), bytes. */
export const MAX_IN_MEMORY_EXPORT_BYTES = 1 << 30;

/** An export held in memory: the data file's bytes and its metadata text. */
export interface InMemoryExport extends ExportResult {
  readonly data: Uint8Array;
}

/**
 * Runs the same export pipeline the CLI streams to disk and collects the data in one buffer (for a browser download).
 * Same configuration and options → the same bytes and metadata text as `crestline generate`.
 */
export function exportToMemory(config: WaveformConfig, options: ExportOptionsInput = {}, hooks: ExportHooks = {}): InMemoryExport {
  const plan = planExport(config, options);
  const parts: Uint8Array[] = [];
  let size = 0;
  const steps = runExport(plan, hooks);
  for (;;) {
    const step = steps.next();
    if (step.done) {
      const data = new Uint8Array(size);
      let o = 0;
      for (const p of parts) {
        data.set(p, o);
        o += p.length;
      }
      return { ...step.value, data };
    }
    if (step.value.kind === 'data') {
      size += step.value.bytes.length;
      if (size > MAX_IN_MEMORY_EXPORT_BYTES) {
        steps.return(undefined as never);
        throw new DspError('INVALID_CONFIG', `The export passed ${MAX_IN_MEMORY_EXPORT_BYTES} bytes, the most held in memory; use the CLI (crestline generate), which streams to disk.`, { field: 'symbols' });
      }
      parts.push(step.value.bytes);
    }
  }
}

/** File names of an export: the data file and its metadata (SigMF meta or JSON sidecar), from a base name. */
export function exportFileNames(base: string, result: Pick<ExportResult, 'dataSuffix' | 'metaSuffix'>): { data: string; meta: string } {
  return { data: `${base}${result.dataSuffix}`, meta: `${base}${result.metaSuffix}` };
}
