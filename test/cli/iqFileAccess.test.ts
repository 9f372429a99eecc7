import { mkdirSync, mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { hasSigmfSuffix, regularFileSizeBytes, sigmfPathsOf } from '../../src/cli/iqFileAccess';
import { readIqFile } from '../../src/cli/readIqFile';
import { readRecording } from '../../src/cli/readRecording';
import { dspErrorOf } from '../helpers/dspErrorOf';

describe('iqFileAccess: the SigMF pair and file sizes both IQ readers use', () => {
  it('names BASE.sigmf-meta and BASE.sigmf-data from either file or from BASE', () => {
    // SigMF: a recording is the pair BASE.sigmf-meta + BASE.sigmf-data (SigMF specification, from memory).
    for (const given of ['/r/rec', '/r/rec.sigmf-meta', '/r/rec.sigmf-data', '/r/rec.SIGMF-DATA']) {
      expect(sigmfPathsOf(given), given).toEqual({ basePath: '/r/rec', metaPath: '/r/rec.sigmf-meta', dataPath: '/r/rec.sigmf-data' });
    }
    // Only the final suffix counts. A .sigmf file is a tar archive of the pair, not one of its files (SigMF specification, from memory).
    expect(sigmfPathsOf('/r/a.sigmf-data.sigmf-meta').basePath).toBe('/r/a.sigmf-data');
    expect([hasSigmfSuffix('x.sigmf-meta'), hasSigmfSuffix('x.Sigmf-Data'), hasSigmfSuffix('x.sigmf'), hasSigmfSuffix('x.iq.json')]).toEqual([true, true, false, false]);
  });

  it('gives the size of a regular file and hands the reason for any other to the caller', () => {
    const dir = mkdtempSync(join(tmpdir(), 'crestline-size-'));
    // A directory is not a regular file (common practice: stat's isFile()).
    expect(() => regularFileSizeBytes(dir, (reason) => new Error(`sized: ${reason}`))).toThrow(/^sized: not a regular file$/);
    expect(() => regularFileSizeBytes(join(dir, 'none'), (reason) => new Error(`sized: ${reason}`))).toThrow(/^sized: ENOENT/);
  });

  it('keeps each reader’s own wording for a missing file or a directory', () => {
    const dir = mkdtempSync(join(tmpdir(), 'crestline-readers-'));
    mkdirSync(join(dir, 'folder.sigmf-data'));
    // Messages as the readers wrote them before sharing this module (test/cli/analyze.test.ts, inspect.test.ts).
    const recording = dspErrorOf(() => readRecording(join(dir, 'folder.sigmf-data'), 1e6, {}));
    expect(recording.message).toBe(`Cannot read IQ file "${join(dir, 'folder.sigmf-data')}": not a regular file`);
    expect(recording.code).toBe('INVALID_FILE');
    const missing = dspErrorOf(() => readIqFile(join(dir, 'nothing.sigmf-meta')));
    expect(missing.message).toMatch(new RegExp(`^${join(dir, 'nothing.sigmf-meta')}: cannot open the SigMF metadata file \\(ENOENT.*\\)\\.$`));
    expect(missing.details).toEqual({ problem: 'missing' });
  });
});
