import { describe, expect, it } from 'vitest';
import { parseWaveformConfig } from '../../../src/config/configParse';
import { checkConfigSchema } from '../../../src/config/schemaIssues';
import {
  allocationValue,
  blockAtRb,
  blockFieldPath,
  nextFreeBlock,
  readBlocks,
  withBlockRange,
} from '../../../src/ui/form/allocationBlocks';
import { readAtPath, writeAtPath } from '../../../src/ui/form/draftPath';
import { applyFieldChange, CUSTOM_NUMEROLOGY_START } from '../../../src/ui/form/draftTransitions';
import { createWaveformPlan } from '../../../src/dsp/waveform/waveformPlan';
import { gridNumRb } from '../../../src/ui/form/gridSize';
import { configFields, DATA_SOURCES } from '../../../src/ui/panels/configFields';

describe('draft paths', () => {
  it('reads and writes nested values without touching the original', () => {
    const draft = { data: { source: 'random', seed: 3 }, allocation: [{ startRb: 0, numRb: 4 }, { startRb: 10, numRb: 2 }] };
    expect(readAtPath(draft, 'data.seed')).toBe(3);
    expect(readAtPath(draft, 'allocation.1.numRb')).toBe(2);
    expect(readAtPath(draft, 'custom.fftSize')).toBeUndefined();
    const next = writeAtPath(draft, 'allocation.1.numRb', 6);
    expect(readAtPath(next, 'allocation.1.numRb')).toBe(6);
    expect(draft.allocation[1]!.numRb).toBe(2);
    expect(next.data).toBe(draft.data); // untouched branches are shared
    expect(writeAtPath(draft, 'data.seed', undefined)).toEqual({ ...draft, data: { source: 'random' } });
    expect(writeAtPath({}, 'custom.numRb', 5)).toEqual({ custom: { numRb: 5 } });
  });
});

describe('field transitions', () => {
  it('keeps the seed or hex when switching the data source, and drops it for a PN sequence', () => {
    let draft = applyFieldChange({ data: { source: 'pn9' } }, 'data.source', 'random');
    expect(draft.data).toEqual({ source: 'random', seed: 1 });
    draft = applyFieldChange(draft, 'data.seed', 77);
    draft = applyFieldChange(draft, 'data.source', 'pn23');
    expect(draft.data).toEqual({ source: 'pn23' });
    expect(applyFieldChange({}, 'data.source', 'bits').data).toEqual({ source: 'bits', hex: 'A5F0' });
    // each result is a configuration the schema accepts
    for (const source of DATA_SOURCES) expect(checkConfigSchema(applyFieldChange({}, 'data.source', source)).issues).toEqual([]);
  });

  it('adds a research numerology for "custom" and removes it (and the spacing) when leaving', () => {
    const custom = applyFieldChange({ standard: 'nr', subcarrierSpacingKHz: 60 }, 'standard', 'custom');
    expect(custom).toEqual({ standard: 'custom', custom: CUSTOM_NUMEROLOGY_START });
    expect(() => parseWaveformConfig(custom)).not.toThrow();
    expect(applyFieldChange(custom, 'standard', 'lte')).toEqual({ standard: 'lte' });
  });

  it('drops DFT-s-OFDM on the downlink and the comb fields for localized mapping', () => {
    expect(applyFieldChange({ waveform: 'dft-s-ofdm' }, 'link', 'downlink')).toEqual({ link: 'downlink' });
    expect(applyFieldChange({ mapping: 'interleaved', interleaveFactor: 4, combOffset: 1 }, 'mapping', 'localized')).toEqual({
      mapping: 'localized',
    });
  });
});

describe('grid size for the RB picker', () => {
  it('follows the standards’ tables', () => {
    expect(gridNumRb({})).toBe(100); // LTE 20 MHz: 100 RB, TS 36.101 Table 5.6-1
    expect(gridNumRb({ bandwidthMHz: 10 })).toBe(50); // TS 36.101 Table 5.6-1
    expect(gridNumRb({ standard: 'nr', bandwidthMHz: 100 })).toBe(273); // 30 kHz, TS 38.101-1 Table 5.3.2-1
    expect(gridNumRb({ standard: 'nr', subcarrierSpacingKHz: 15, bandwidthMHz: 20 })).toBe(106); // TS 38.101-1 Table 5.3.2-1
    expect(gridNumRb({ bandwidthMHz: 7 })).toBeUndefined();
    expect(gridNumRb({ standard: 'custom', custom: { fftSize: 256, numRb: 12, cpLengthSamples: 18 } })).toBe(12);
  });

  it('agrees with the engine for every bandwidth the form suggests', () => {
    const bandwidth = configFields.find((f) => f.path === 'bandwidthMHz');
    if (bandwidth?.kind !== 'number' || bandwidth.suggestions === undefined) throw new Error('bandwidth field has no suggestions');
    for (const draft of [{}, { standard: 'nr' }, { standard: 'nr', subcarrierSpacingKHz: 60 }]) {
      for (const bandwidthMHz of bandwidth.suggestions(draft)) {
        // OFDM: a full DFT-s-OFDM allocation is not always an allowed DFT size (e.g. 11 RB).
        const withBw = { ...draft, bandwidthMHz, symbols: 1, waveform: 'ofdm' };
        const plan = createWaveformPlan(parseWaveformConfig(withBw));
        expect(gridNumRb(withBw), JSON.stringify(withBw)).toBe(plan.numerology.numRb);
      }
    }
  });
});

describe('allocation blocks', () => {
  it('stores one block as an object and several as a list, as the CLI JSON takes them', () => {
    expect(allocationValue([])).toBeUndefined();
    expect(allocationValue([{ startRb: 2, numRb: 3 }])).toEqual({ startRb: 2, numRb: 3 });
    expect(allocationValue([{ startRb: 0, numRb: 1, modulation: '16qam' }, { startRb: 5, numRb: 2, powerOffsetDb: -3 }])).toEqual([
      { startRb: 0, numRb: 1, modulation: '16qam' },
      { startRb: 5, numRb: 2, powerOffsetDb: -3 },
    ]);
    expect(readBlocks({ allocation: { startRb: 2, numRb: 3 } })).toEqual([{ startRb: 2, numRb: 3 }]);
    expect(readBlocks({})).toEqual([]);
  });

  it('names block fields with the paths the schema and the engine report', () => {
    expect(blockFieldPath(1, 0, 'numRb')).toBe('allocation.numRb');
    expect(blockFieldPath(2, 1, 'startRb')).toBe('allocation.1.startRb');
    const schemaIssue = checkConfigSchema({ allocation: [{ startRb: 0, numRb: 1 }, { startRb: 4, numRb: 0 }] }).issues;
    expect(schemaIssue.map((i) => i.path)).toEqual([blockFieldPath(2, 1, 'numRb')]);
    let enginePath: unknown;
    try {
      parseWaveformConfig({ bandwidthMHz: 1.4, allocation: { startRb: 4, numRb: 4 } });
    } catch (error) {
      enginePath = ((error as { details?: { issues?: { path: string }[] } }).details?.issues ?? [])[0]?.path;
    }
    expect(enginePath).toBe(blockFieldPath(1, 0, 'numRb'));
  });

  it('finds free RBs for a new block, after the last one first', () => {
    const blocks = [{ startRb: 0, numRb: 4 }, { startRb: 6, numRb: 2 }];
    expect(nextFreeBlock(blocks, 10)).toEqual({ startRb: 8, numRb: 2 });
    expect(nextFreeBlock([{ startRb: 2, numRb: 8 }], 10)).toEqual({ startRb: 0, numRb: 2 });
    expect(nextFreeBlock([{ startRb: 0, numRb: 10 }], 10)).toBeUndefined();
    expect(blockAtRb(blocks, 7)).toBe(1);
    expect(blockAtRb(blocks, 5)).toBe(-1);
  });

  it('sets a block from a drag in either direction, clamped to the grid', () => {
    const blocks = [{ startRb: 0, numRb: 4, modulation: '64qam' }];
    expect(withBlockRange(blocks, 0, 9, 3, 50)).toEqual([{ startRb: 3, numRb: 7, modulation: '64qam' }]);
    expect(withBlockRange(blocks, 0, 45, 80, 50)).toEqual([{ startRb: 45, numRb: 5, modulation: '64qam' }]);
  });
});
