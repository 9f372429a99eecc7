import { statSync, type Stats } from 'node:fs';

/** Paths of a SigMF recording: BASE.sigmf-meta beside BASE.sigmf-data. */
export interface SigmfPaths {
  readonly basePath: string;
  readonly metaPath: string;
  readonly dataPath: string;
}

const SIGMF_SUFFIX = /\.sigmf-(data|meta)$/i;

/** True when `path` names one file of a SigMF pair (ends in .sigmf-meta or .sigmf-data, any case). */
export function hasSigmfSuffix(path: string): boolean {
  return SIGMF_SUFFIX.test(path);
}

/**
 * The SigMF pair a path names: BASE.sigmf-meta, BASE.sigmf-data or BASE itself all give BASE.sigmf-meta and
 * BASE.sigmf-data. Says nothing about whether the files exist.
 */
export function sigmfPathsOf(path: string): SigmfPaths {
  const basePath = path.replace(SIGMF_SUFFIX, '');
  return { basePath, metaPath: `${basePath}.sigmf-meta`, dataPath: `${basePath}.sigmf-data` };
}

/**
 * Size in bytes of a regular file.
 * @param describeFailure builds the error thrown when the file is missing, unreadable or not a regular file, from the
 *   reason (the system's message, or "not a regular file"); each reader keeps its own wording
 */
export function regularFileSizeBytes(path: string, describeFailure: (reason: string) => Error): number {
  let stats: Stats;
  try {
    stats = statSync(path);
  } catch (err) {
    throw describeFailure((err as Error).message);
  }
  if (!stats.isFile()) throw describeFailure('not a regular file');
  return stats.size;
}
