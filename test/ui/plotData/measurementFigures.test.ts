import { describe, expect, it } from 'vitest';
import { parseWaveformConfig } from '../../../src/config/configParse';
import { createAmplifierFromConfig } from '../../../src/dsp/amplifier/createAmplifier';
import { analyzeBackoff } from '../../../src/dsp/backoff/backoffAnalysis';
import { aclrByGroup, buildBackoffFigure, channelGroup } from '../../../src/ui/plotData/backoff';
import { plotThemes } from '../../../src/ui/plotData/plotTheme';
import { buildSpectrumFigure, spectrumLine } from '../../../src/ui/plotData/spectrum';
import { createEngineClient } from '../../../src/worker/client';
import { InProcessWorker } from '../../worker/inProcessWorker';

// Plot helpers over real engine output (through the worker protocol, as the page gets it).

/** LTE 5 MHz uplink, 25 RB (TS 36.101 Table 5.6-1). */
const config = { standard: 'lte', bandwidthMHz: 5, symbols: 14, modulation: 'qpsk', amplifier: { model: 'rapp', smoothness: 2, backoffDb: 4 } };
const absTolDb = 1e-9;

describe('spectrum figure', () => {
  it('shows the PSD in dBc per RBW, so the in-band level sits at 10·log10(RBW / channel width)', async () => {
    const client = createEngineClient({ createWorker: () => new InProcessWorker(), poolSize: 1 });
    const result = await client.spectrum({ ...config, amplifier: undefined });
    client.dispose();
    const s = result.waveform;
    const line = spectrumLine(s, s.psdPerHz.length);
    // Parseval: Σ PSD·binWidth over the assigned channel equals its power, so a flat in-band PSD reads
    // 10·log10(RBW / (N_RB·180 kHz)) dBc per RBW (common practice for a flat-topped OFDM spectrum).
    // Single Welch bins scatter (few segments), so average the linear level over the inner ±2 MHz.
    let sum = 0;
    let count = 0;
    line.frequencyMHz.forEach((f, i) => {
      if (Math.abs(f) < 2) {
        sum += 10 ** (line.levelDbc[i]! / 10);
        count += 1;
      }
    });
    expect(10 * Math.log10(sum / count)).toBeCloseTo(10 * Math.log10(s.rbwHz / 4.5e6), 0);
    // Peak hold keeps the maximum of each group.
    const thinned = spectrumLine(s, 100);
    expect(thinned.levelDbc.length).toBeLessThanOrEqual(100);
    expect(Math.max(...thinned.levelDbc)).toBeCloseTo(Math.max(...line.levelDbc), 9);
    const figure = buildSpectrumFigure({ primary: s, generated: null, overlays: [], label: 'current' }, plotThemes.light);
    // One shaded band per ACLR channel plus the assigned one; the ACLR values are the engine's, printed.
    const rects = (figure.layout.shapes ?? []).filter((sh) => sh.type === 'rect');
    expect(rects).toHaveLength(s.aclr.values.length + 1);
    const eutra = s.aclr.values.find((v) => v.key === 'eutraUpper')!;
    expect((figure.layout.annotations ?? []).some((a) => String(a.text).includes(eutra.aclrDb.toFixed(1)))).toBe(true);
  });
});

describe('back-off figure', () => {
  it('groups both sides of a channel (worse side) and marks each scenario’s answer', () => {
    const parsed = parseWaveformConfig(config);
    const analysis = analyzeBackoff(parsed, { model: createAmplifierFromConfig(parsed.amplifier!), fromDb: 2, toDb: 10, stepDb: 2 });
    const groups = aclrByGroup(analysis);
    expect([...groups.keys()].sort()).toEqual(['eutra', 'utra1', 'utra2']); // TS 36.101 §6.6.2.3 channels for 5 MHz
    const point = analysis.curve[0]!;
    expect(groups.get('eutra')!.aclrDb[0]).toBeCloseTo(Math.min(point.aclrDb.eutraLower!, point.aclrDb.eutraUpper!), 12);
    expect(groups.get('eutra')!.limitDb).toBe(analysis.limits.aclr.eutraLower!.value);
    expect(channelGroup('utra2Upper')).toBe('utra2');
    const figure = buildBackoffFigure(
      [
        { name: 'current', colour: '#000', analysis, current: true },
        { name: 'pinned', colour: '#c2571a', analysis, current: false },
      ],
      plotThemes.light,
    );
    // Current: EVM + three ACLR groups; pinned: EVM + its limiting group.
    expect(figure.data.length).toBe(4 + 2);
    const answers = (figure.layout.shapes ?? []).filter((sh) => sh.xref === 'x' && sh.type === 'line').map((sh) => Number(sh.x0));
    expect(answers).toHaveLength(2);
    for (const x of answers) expect(Math.abs(x - analysis.requiredOboDb!)).toBeLessThan(absTolDb);
  });
});
