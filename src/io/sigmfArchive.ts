import { DspError } from '../dsp/errors';
import { encodeUstarArchive, USTAR_MAX_NAME_BYTES, type UstarMember } from './ustar';

/**
 * SigMF archives: one Recording in a POSIX tar file named `N.sigmf`, holding the directory `N`, `N/N.sigmf-meta` and
 * `N/N.sigmf-data` (SigMF spec v1.2.x, "Rules for SigMF Archive files": tar as POSIX.1-2001, extension `.sigmf`, at
 * least one Recording, meta and data in one directory; the `N`, `N/N.sigmf-meta`, `N/N.sigmf-data` layout is the
 * rule of the earlier 1.x text, still valid). Readers accept any one pair `D/B.sigmf-meta` + `D/B.sigmf-data`.
 */
export const SIGMF_ARCHIVE_SUFFIX = '.sigmf';

export interface SigmfArchiveNames {
  readonly directory: string;
  readonly meta: string;
  readonly data: string;
}

const encoder = new TextEncoder();

/**
 * Member names for a recording called `name` (the archive's base name, without folders).
 * @throws DspError INVALID_CONFIG when the name is empty, holds "/" or "\\", or makes `N/N.sigmf-data` longer than a
 *   100-byte ustar name (a name of at most 44 ASCII characters fits)
 */
export function sigmfArchiveNames(name: string): SigmfArchiveNames {
  if (name === '' || /[\\/]/.test(name) || name === '.' || name === '..') {
    throw new DspError('INVALID_CONFIG', `SigMF archive name "${name}" must be a plain file name (no folders, not empty).`, { field: 'out' });
  }
  const data = `${name}/${name}.sigmf-data`;
  const bytes = encoder.encode(data).length;
  if (bytes > USTAR_MAX_NAME_BYTES) {
    throw new DspError(
      'INVALID_CONFIG',
      `SigMF archive name "${name}" is too long: the member "${data}" would be ${bytes} bytes and tar names here are at most ${USTAR_MAX_NAME_BYTES}; use a base name of at most 44 ASCII characters.`,
      { field: 'out' },
    );
  }
  return { directory: `${name}/`, meta: `${name}/${name}.sigmf-meta`, data };
}

/**
 * A whole archive in memory: directory, data, then metadata (the order the CLI streams it in, so the bytes match at
 * the same modification time `mtimeS`, seconds since 1970; default 0).
 */
export function encodeSigmfArchive(name: string, metaText: string, data: Uint8Array, mtimeS = 0): Uint8Array {
  const names = sigmfArchiveNames(name);
  return encodeUstarArchive(
    [
      { name: names.directory, type: 'directory' },
      { name: names.data, type: 'file', bytes: data },
      { name: names.meta, type: 'file', bytes: encoder.encode(metaText) },
    ],
    mtimeS,
  );
}

/**
 * The Recording in an archive's member list: the one `.sigmf-meta` whose `.sigmf-data` sits beside it.
 * @throws DspError INVALID_FILE naming the archive: no Recording, or more than one ("structure")
 */
export function findSigmfRecording(members: readonly UstarMember[], archiveName: string): { meta: UstarMember; data: UstarMember } {
  const files = new Map(members.filter((m) => m.type === 'file').map((m) => [m.name, m]));
  const pairs: { meta: UstarMember; data: UstarMember }[] = [];
  for (const [name, meta] of files) {
    if (!name.endsWith('.sigmf-meta')) continue;
    const data = files.get(`${name.slice(0, -'.sigmf-meta'.length)}.sigmf-data`);
    if (data) pairs.push({ meta, data });
  }
  if (pairs.length === 0) {
    const listed = members.map((m) => m.name).slice(0, 8).join(', ') || 'nothing';
    throw new DspError('INVALID_FILE', `${archiveName}: holds no SigMF Recording (a B.sigmf-meta with its B.sigmf-data in the same folder); found ${listed}.`, {
      problem: 'structure',
    });
  }
  if (pairs.length > 1) {
    throw new DspError('INVALID_FILE', `${archiveName}: holds ${pairs.length} Recordings (${pairs.map((p) => p.meta.name).join(', ')}); archives with one Recording are read.`, {
      problem: 'structure',
    });
  }
  return pairs[0]!;
}
