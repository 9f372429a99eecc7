import { describe, expect, it } from 'vitest';
import { parseWaveformConfig } from '../../src/config/configParse';
import { defaultScenario, demoScenarios } from '../../src/scenarios/demoScenario';

describe('demo scenarios', () => {
  it('are valid configurations the CLI would accept', () => {
    for (const scenario of demoScenarios) expect(() => parseWaveformConfig(scenario.config), scenario.name).not.toThrow();
  });

  it('differ only in the waveform, so a comparison isolates it', () => {
    const [precoded, plain] = demoScenarios.map((s) => parseWaveformConfig(s.config));
    expect(precoded?.waveform).toBe('dft-s-ofdm');
    expect(plain?.waveform).toBe('ofdm');
    expect({ ...plain, waveform: 'dft-s-ofdm' }).toEqual(precoded);
  });

  it('opens with the DFT-s-OFDM scenario', () => {
    expect(defaultScenario).toBe(demoScenarios[0]);
  });
});
