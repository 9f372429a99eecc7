import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { readTextFile } from '../../src/cli/readTextFile';
import { DspError } from '../../src/dsp/errors';
import { runCli, workDir } from './cliHarness';

describe('readTextFile: the CLI’s one reader of whole text files', () => {
  it('returns the UTF-8 text, and turns a missing file or a directory into a DspError naming what and where', () => {
    const dir = mkdtempSync(join(tmpdir(), 'crestline-read-'));
    const path = join(dir, 'a.txt');
    writeFileSync(path, 'Brackenmoor µ\n');
    expect(readTextFile(path, 'test file', 'INVALID_FILE')).toBe('Brackenmoor µ\n');
    for (const [p, code] of [[join(dir, 'missing.json'), 'INVALID_CONFIG'], [dir, 'INVALID_FILE']] as const) {
      let caught: unknown;
      try {
        readTextFile(p, 'shard file', code);
      } catch (err) {
        caught = err;
      }
      expect(caught).toBeInstanceOf(DspError);
      expect((caught as DspError).code).toBe(code);
      expect((caught as DspError).message).toMatch(new RegExp(`^Cannot read shard file ".*${p.split('/').pop()}": `));
    }
  });

  it('merge and the AM/AM table option report an unreadable file with exit code 2', async () => {
    const { dir, configPath } = workDir({ standard: 'lte', bandwidthMHz: 1.4, symbols: 14 });
    const merge = await runCli(['merge', join(dir, 'nope.json')]);
    expect(merge.code).toBe(2);
    expect(merge.stderr).toMatch(/Cannot read shard file ".*nope\.json"/);
    const backoff = await runCli(['backoff', '--config', configPath, '--pa', `table:${join(dir, 'nope.csv')}`]);
    expect(backoff.code).toBe(2);
    expect(backoff.stderr).toMatch(/Cannot read the AM\/AM table ".*nope\.csv"/);
  });
});
