import { closeSync, fsyncSync, openSync, renameSync, rmSync, writeSync } from 'node:fs';
import { basename, dirname, join } from 'node:path';

/**
 * Writes several files so that either all appear under their final names, complete, or none does:
 * each goes to a temporary name beside its target (`.crestline-tmp-<pid>-<name>`), is fsynced, and only
 * when every write succeeded are they renamed. On any error the temporaries are removed and nothing with a
 * final name is touched.
 */
export function writeFilesAtomically(files: readonly { path: string; bytes: Uint8Array | string }[]): void {
  const temps: string[] = [];
  try {
    for (const f of files) {
      const temp = temporaryPathFor(f.path);
      temps.push(temp);
      const fd = openSync(temp, 'w');
      try {
        const data = typeof f.bytes === 'string' ? Buffer.from(f.bytes, 'utf8') : f.bytes;
        let written = 0;
        while (written < data.byteLength) written += writeSync(fd, data, written, data.byteLength - written);
        fsyncSync(fd);
      } finally {
        closeSync(fd);
      }
    }
    files.forEach((f, i) => renameSync(temps[i]!, f.path));
  } catch (err) {
    for (const t of temps) rmSync(t, { force: true });
    throw err;
  }
}

/** Temporary name beside `finalPath`, unique to this process. */
export function temporaryPathFor(finalPath: string): string {
  return join(dirname(finalPath), `.crestline-tmp-${process.pid}-${basename(finalPath)}`);
}
