import { describe, expect, it } from 'vitest';
import { figureCsv } from '../../../src/ui/plotData/figureCsv';

describe('figure CSV', () => {
  it('writes one row per point of every trace, typed arrays included', () => {
    const csv = figureCsv([
      { type: 'scatter', name: 'I', x: new Float64Array([0, 1]), y: new Float64Array([0.5, -0.25]) },
      { type: 'scatter', name: 'peak, marked', x: [2], y: [Number.NaN] },
    ]);
    expect(csv).toBe('trace,x,y,z\nI,0,0.5,\nI,1,-0.25,\n"peak, marked",2,,\n');
  });

  it('writes a heatmap as column, row, value', () => {
    expect(figureCsv([{ type: 'heatmap', name: 'grid', z: [[0, 1], [2, 1]] }])).toBe('trace,x,y,z\ngrid,0,0,0\ngrid,1,0,1\ngrid,0,1,2\ngrid,1,1,1\n');
  });
});
