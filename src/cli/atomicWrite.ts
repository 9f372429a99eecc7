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
      writeDurably(temp, f.bytes);
    }
    files.forEach((f, i) => renameSync(temps[i]!, f.path));
  } catch (err) {
    for (const t of temps) rmSync(t, { force: true });
    throw err;
  }
}

/** Writes `bytes` (UTF-8 for a string) to a new file at `path` and fsyncs it before closing. */
function writeDurably(path: string, bytes: Uint8Array | string): void {
  const fd = openSync(path, 'w');
  try {
    writeAll(fd, typeof bytes === 'string' ? Buffer.from(bytes, 'utf8') : bytes);
    fsyncSync(fd);
  } finally {
    closeSync(fd);
  }
}

/** writeSync until every byte is out (a single call may write fewer). */
function writeAll(fd: number, bytes: Uint8Array): void {
  let written = 0;
  while (written < bytes.byteLength) written += writeSync(fd, bytes, written, bytes.byteLength - written);
}

/** Temporary name beside `finalPath`, unique to this process. */
export function temporaryPathFor(finalPath: string): string {
  return join(dirname(finalPath), `.crestline-tmp-${process.pid}-${basename(finalPath)}`);
}

/** A data file being written under a temporary name, plus the small files committed with it. */
export interface AtomicStreamWriter {
  /** Temporary path the data goes to until `commit`. */
  readonly tempPath: string;
  write(bytes: Uint8Array): void;
  /**
   * Fsyncs and renames the data file to its final name, after writing `companions` (e.g. the metadata) atomically
   * beside it; the data is renamed first and the metadata last, so a complete metadata file means complete data.
   */
  commit(companions: readonly { path: string; bytes: Uint8Array | string }[]): void;
  /** Closes and removes the temporary file; nothing with the final name is created. Safe to call twice. */
  abort(): void;
}

/** Opens `finalPath`'s temporary twin for streaming; nothing appears under `finalPath` before `commit`. */
export function openAtomicStream(finalPath: string): AtomicStreamWriter {
  const tempPath = temporaryPathFor(finalPath);
  let fd: number | undefined = openSync(tempPath, 'w');
  const closeFd = (): void => {
    if (fd !== undefined) {
      const f = fd;
      fd = undefined;
      closeSync(f);
    }
  };
  return {
    tempPath,
    write(bytes) {
      if (fd === undefined) throw new Error(`${finalPath}: write after the file was closed.`);
      writeAll(fd, bytes);
    },
    commit(companions) {
      if (fd === undefined) throw new Error(`${finalPath}: commit after the file was closed.`);
      const temps: string[] = [];
      let dataRenamed = false;
      try {
        fsyncSync(fd);
        closeFd();
        for (const c of companions) {
          const t = temporaryPathFor(c.path);
          temps.push(t);
          writeDurably(t, c.bytes);
        }
        renameSync(tempPath, finalPath);
        dataRenamed = true;
        companions.forEach((c, i) => renameSync(temps[i]!, c.path));
      } catch (err) {
        for (const t of temps) rmSync(t, { force: true });
        rmSync(tempPath, { force: true });
        if (dataRenamed) rmSync(finalPath, { force: true });
        throw err;
      }
    },
    abort() {
      try {
        closeFd();
      } finally {
        rmSync(tempPath, { force: true });
      }
    },
  };
}
