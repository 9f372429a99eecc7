import { parseWaveformConfig } from '../src/config/configParse';
import { createWaveformGenerator } from '../src/dsp/waveform/waveformGenerator';
import { createWaveformPlan } from '../src/dsp/waveform/waveformPlan';
const plan = createWaveformPlan(parseWaveformConfig({ oversampling: Number(process.argv[2] ?? 1), symbols: 14, link: process.argv[3] ?? 'uplink' }));
const g = createWaveformGenerator(plan);
const t0 = performance.now(); let n = 0;
while (performance.now() - t0 < 4000) { g.generate(14); n += 14; }
console.log((performance.now() - t0) * 1000 / n, 'us/sym');
