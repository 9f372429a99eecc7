import { describe, expect, it } from 'vitest';
import { parseWaveformConfigJson } from '../../src/config/configParse';
import { parseJsonText } from '../../src/dsp/jsonText';
import { parseShardFile } from '../../src/dsp/montecarlo/shardFile';
import { parseIqSidecar } from '../../src/io/iqSidecar';
import { parseSigmfMeta } from '../../src/io/sigmfMeta';
import { dspErrorOf } from '../helpers/dspErrorOf';

describe('parseJsonText: the one JSON reader of configurations and files', () => {
  it('returns the parsed value and words a syntax error with the source name and the parser’s reason', () => {
    // JSON per RFC 8259 (from memory): a bare number and an object are both JSON texts.
    expect(parseJsonText('{"a": [1, 2]}', 'x', 'INVALID_FILE')).toEqual({ a: [1, 2] });
    expect(parseJsonText('3', 'x', 'INVALID_FILE')).toBe(3);
    const e = dspErrorOf(() => parseJsonText('{"a": ', 'cfg.json', 'INVALID_CONFIG', { field: 'x' }));
    expect(e.code).toBe('INVALID_CONFIG');
    expect(e.message).toMatch(/^cfg\.json: not valid JSON \(.+\)\.$/);
    expect(e.details).toEqual({ field: 'x' });
  });

  it('keeps each reader’s documented code and details.problem', () => {
    // Codes as documented at each reader (configParse.ts, iqSidecar.ts, sigmfMeta.ts, shardFile.ts; DEVELOPERS.md import list).
    const cases = [
      [() => parseWaveformConfigJson('{', 'c.json'), 'INVALID_CONFIG', undefined],
      [() => parseIqSidecar('{', 'x.iq.json'), 'INVALID_FILE', { problem: 'json' }],
      [() => parseSigmfMeta('{', 'r.sigmf-meta'), 'INVALID_FILE', { problem: 'json' }],
      [() => parseShardFile('{', 'h.json'), 'INVALID_FILE', undefined],
    ] as const;
    for (const [run, code, details] of cases) {
      const e = dspErrorOf(run);
      expect(e.code, e.message).toBe(code);
      expect(e.details, e.message).toEqual(details);
      expect(e.message).toMatch(/^\S+: not valid JSON \(.+\)\.$/);
    }
  });
});
