import { describe, expect, it } from 'vitest';
import { EXPORT_FORMATS } from '../../../src/io/exportFormats';
import { parseExportOptions } from '../../../src/io/exportOptions';
import { listUstarMembers } from '../../../src/io/ustar';
import { checkExportForm, exportDownloads, exportOptionsInput, FORMAT_LABELS, FORMAT_ORDER, initialExportForm } from '../../../src/ui/export/exportForm';

describe('export form', () => {
  it('starts with the plain generate output (SigMF cf32, formula scale, nothing added)', () => {
    const checked = checkExportForm(initialExportForm('saltway'));
    expect(checked).toEqual({ ok: true, options: { format: 'sigmf-cf32' }, baseName: 'saltway' });
  });

  it('builds the options src/io parses, for every level mode', () => {
    const base = initialExportForm('x');
    const cases = [
      [{ levelMode: 'rms', levelDbfs: '-12.5' }, { mode: 'rms', levelDbfs: -12.5 }],
      [{ levelMode: 'peak', levelDbfs: '-1' }, { mode: 'peak', levelDbfs: -1 }],
      [{ levelMode: 'linear', scaleLinear: '0.01' }, { mode: 'linear', scaleLinear: 0.01 }],
      [{ levelMode: 'auto', autoMarginDb: '2', autoProbability: '1e-3' }, { mode: 'auto', marginDb: 2, probability: 1e-3 }],
      [{ levelMode: 'formula' }, { mode: 'formula' }],
    ] as const;
    for (const [change, level] of cases) {
      const options = exportOptionsInput({ ...base, ...change });
      expect(options.level).toEqual(level);
      expect(() => parseExportOptions(options)).not.toThrow();
    }
    const full = exportOptionsInput({ ...base, format: 'wav16', sampleRateHz: '30.72e6', freqOffsetHz: '-1e6', repeat: '4', author: 'Bench 3' });
    expect(parseExportOptions(full)).toMatchObject({ format: 'wav16', sampleRateHz: 30.72e6, freqOffsetHz: -1e6, repeat: 4, author: 'Bench 3' });
  });

  it('marks a bad value at its field with the schema’s message', () => {
    const checked = checkExportForm({ ...initialExportForm('x'), levelMode: 'rms', levelDbfs: '40', repeat: 'two', baseName: 'a/b' });
    expect(checked.ok).toBe(false);
    if (checked.ok) return;
    expect(Object.keys(checked.errors).sort()).toEqual(['baseName', 'levelDbfs', 'repeat']);
    expect(checked.errors.levelDbfs).toMatch(/20/); // levelDbfs at most +20 (src/io/exportOptions.ts)
  });

  it('labels every format src/io writes', () => {
    expect(Object.keys(FORMAT_LABELS).sort()).toEqual([...EXPORT_FORMATS].sort());
  });

  it('offers every format the command line writes', () => {
    expect([...FORMAT_ORDER].sort()).toEqual([...EXPORT_FORMATS].sort());
  });

  it('saves a data file and its metadata, or one SigMF archive holding both', () => {
    const files = { data: new Uint8Array([1, 2, 3, 4, 5, 6, 7, 8]), metaText: '{"global":{}}', dataSuffix: '.sigmf-data', metaSuffix: '.sigmf-meta' };
    const pair = exportDownloads('sigmf-cf32', 'bench', files, 0);
    expect(pair.map((f) => f.name)).toEqual(['bench.sigmf-data', 'bench.sigmf-meta']);
    const [archive] = exportDownloads('sigmf-archive', 'bench', files, 1_800_000_000);
    expect(archive!.name).toBe('bench.sigmf');
    expect(archive!.mimeType).toBe('application/x-tar');
    // SigMF archive layout (SigMF spec, Archive format): a folder NAME/ holding NAME.sigmf-data and NAME.sigmf-meta.
    const bytes = archive!.content as Uint8Array;
    const members = listUstarMembers(bytes.length, (offset, length) => bytes.subarray(offset, offset + length), 'bench.sigmf');
    expect(members.map((m) => [m.type, m.name])).toEqual([
      ['directory', 'bench'],
      ['file', 'bench/bench.sigmf-data'],
      ['file', 'bench/bench.sigmf-meta'],
    ]);
    const data = members[1]!;
    expect([...bytes.subarray(data.dataOffsetBytes, data.dataOffsetBytes + data.sizeBytes)]).toEqual([...files.data]);
    expect(members[2]!.sizeBytes).toBe(files.metaText.length);
  });

  it('refuses an archive name too long for a tar member, at the file-name field', () => {
    // ustar names hold at most 100 bytes (POSIX.1-1988 ustar header, common practice): 2·45 + 12 = 102 is too long.
    const checked = checkExportForm({ ...initialExportForm('a'.repeat(45)), format: 'sigmf-archive' });
    expect(checked.ok).toBe(false);
    if (!checked.ok) expect(checked.errors.baseName).toMatch(/too long.*at most 44/);
    expect(checkExportForm({ ...initialExportForm('a'.repeat(44)), format: 'sigmf-archive' }).ok).toBe(true);
  });
});
