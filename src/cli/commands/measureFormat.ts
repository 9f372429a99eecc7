import { LEVEL_KEYS } from '../../dsp/metrics/ccdfLevels';
import type { IntervalMap, LevelMap, MeasureReport } from '../../dsp/montecarlo/measureReport';

/** The readable table `crestline measure` and `crestline merge` print without --json. */
export function formatMeasureTable(r: MeasureReport): string[] {
  const lines: string[] = [];
  lines.push(`Crestline measurement: ${r.configuration}`);
  lines.push(
    `${r.symbols} symbols at oversampling ${r.oversampling} (${mhz(r.sampleRateHz)} Msps), run seed ${r.runSeed}, ${r.numBlocks} blocks of ${r.blockSymbols} symbols, ${r.precision}`,
  );
  lines.push('');
  const header = `${'CCDF level (dB)'.padEnd(34)}${LEVEL_KEYS.map((k) => k.padStart(8)).join('')}`;
  lines.push(header);
  const row = (label: string, levels: LevelMap) => lines.push(`${label.padEnd(34)}${LEVEL_KEYS.map((k) => fmt(levels[k]).padStart(8)).join('')}`);
  const ci = (intervals: IntervalMap) =>
    lines.push(`${'  95 % interval (half-width)'.padEnd(34)}${LEVEL_KEYS.map((k) => interval(intervals[k]).padStart(8)).join('')}`);
  row('PAPR, peak / run mean', r.paprRunMeanDb);
  ci(r.paprRunMeanCi95Db);
  row('PAPR, peak / symbol mean', r.paprSymbolMeanDb);
  ci(r.paprSymbolMeanCi95Db);
  row('Power CCDF, |x|² / mean', r.ccdfDb);
  ci(r.ccdfCi95Db);
  row(`OFDM theory N=${r.theory.numSubcarriers}, α=1`, r.theory.nyquistDb);
  row(`OFDM theory N=${r.theory.numSubcarriers}, α=2.8`, r.theory.oversampledDb);
  lines.push(`  highest symbol PAPR: ${r.maxPaprDb.runMean.toFixed(2)} dB (run mean), ${r.maxPaprDb.symbolMean.toFixed(2)} dB (symbol mean)`);
  lines.push('');
  lines.push(`Cubic metric        ${r.cubicMetricDb.toFixed(2)} dB (raw ${r.cubicMetricRawDb.toFixed(2)} dB; ${r.cubicMetricDefinition})`);
  const dbfs = r.meanPowerDbfs === null ? '' : ` = ${r.meanPowerDbfs.toFixed(2)} dBFS`;
  const peakDbfs = r.peakPowerDbfs === null ? '' : ` = ${r.peakPowerDbfs.toFixed(2)} dBFS`;
  lines.push(`Mean power          ${r.meanPowerDb.toFixed(2)} dB${dbfs} (expected ${r.expectedMeanPowerDb.toFixed(2)} dB)`);
  lines.push(`Peak power          ${r.peakPowerDb.toFixed(2)} dB${peakDbfs}; crest factor ${r.crestFactorDb.toFixed(2)} dB`);
  if (r.occupiedBandwidthHz !== null) lines.push(`Occupied bandwidth  ${mhz(r.occupiedBandwidthHz, 3)} MHz (99 %)`);
  if (r.aclrChannels.length > 0) {
    lines.push('ACLR');
    for (const c of r.aclrChannels) {
      const value = c.aclrDb === null ? 'unbounded' : `${c.aclrDb.toFixed(2)} dB`;
      lines.push(`  ${c.label.padEnd(16)} ${signedMhz(c.offsetHz).padStart(10)} MHz  ${value.padStart(10)}  ${c.filter}`);
    }
    lines.push(`  method: ${r.aclrMethod}`);
  }
  if (r.spectrum) {
    const s = r.spectrum;
    lines.push(
      `Spectrum            ${s.window} window, RBW ${(s.rbwHz / 1e3).toFixed(2)} kHz, ${s.numSegments} segments of ${s.segmentLength}; ${s.symbols} symbols of the configured waveform (data ${s.dataSource}) at oversampling ${s.oversampling}`,
    );
  }
  if (r.notes.length > 0) {
    lines.push('', 'notes:');
    for (const n of r.notes) lines.push(`  - ${n}`);
  }
  if (r.warnings.length > 0) {
    lines.push('', 'warnings:');
    for (const w of r.warnings) lines.push(`  - ${w}`);
  }
  return lines;
}

function fmt(value: number | null): string {
  return value === null ? '—' : value.toFixed(2);
}

/** Half-width of a 95 % interval, "±0.12" ("?" when a side fell outside the histogram). */
function interval(value: readonly [number | null, number | null] | null): string {
  if (value === null) return '—';
  const [lo, hi] = value;
  if (lo === null || hi === null) return '?';
  return `±${((hi - lo) / 2).toFixed(2)}`;
}

function mhz(hz: number, decimals = 2): string {
  return (hz / 1e6).toFixed(decimals);
}

function signedMhz(hz: number): string {
  return `${hz > 0 ? '+' : hz < 0 ? '−' : ''}${Math.abs(hz / 1e6).toFixed(2)}`;
}
