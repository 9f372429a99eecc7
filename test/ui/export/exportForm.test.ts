import { describe, expect, it } from 'vitest';
import { EXPORT_FORMATS } from '../../../src/io/exportFormats';
import { parseExportOptions } from '../../../src/io/exportOptions';
import { checkExportForm, exportOptionsInput, FORMAT_LABELS, initialExportForm } from '../../../src/ui/export/exportForm';

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
});
