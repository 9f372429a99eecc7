import { describe, expect, it } from 'vitest';
import { computeAmplifierCurves } from '../../../src/dsp/amplifier/amplifierCurves';
import { amplifyAtDrive, solveDrive } from '../../../src/dsp/amplifier/drive';
import { createPolynomialModel } from '../../../src/dsp/amplifier/polynomial';
import { createRappModel } from '../../../src/dsp/amplifier/rapp';
import { createSalehModel } from '../../../src/dsp/amplifier/saleh';
import { createSoftLimiterModel } from '../../../src/dsp/amplifier/softLimiter';
import { createRng } from '../../../src/dsp/data/rng';
import { DspError } from '../../../src/dsp/errors';
import { TEST_SEED } from '../../helpers/seed';

const toleranceDb = 1e-3;

function gaussianSignal(n: number, seed: number): Float64Array {
  const rng = createRng(seed);
  return new Float64Array(2 * n).map(() => 3 * rng.nextGaussian());
}

function meanPower(iq: Float64Array): number {
  let s = 0;
  for (let i = 0; i < iq.length; i++) s += iq[i]! ** 2;
  return s / (iq.length / 2);
}

describe('drive by IBO or OBO (back-off definitions: REFERENCE.md §7, common practice)', () => {
  const signal = gaussianSignal(20000, TEST_SEED);

  it('IBO sets the input power directly and OBO is measured on the output', () => {
    const model = createRappModel({ smoothness: 2, outputSaturationAmplitude: 2 });
    const point = solveDrive(model, signal, { reference: 'ibo', backoffDb: 8 });
    expect(10 * Math.log10(model.inputSaturationAmplitude ** 2 / (meanPower(signal) * point.inputScale ** 2))).toBeCloseTo(8, 9);
    const out = model.apply(signal, point.inputScale, new Float64Array(signal.length));
    expect(10 * Math.log10(4 / meanPower(out))).toBeCloseTo(point.oboDb, 9);
    expect(point.oboDb).toBeGreaterThan(8); // compression lowers the output below the linear prediction
  });

  it('finds the input scale that gives the wanted OBO, by measurement, for every model kind', () => {
    const models = [
      createRappModel({ smoothness: 3 }),
      createSalehModel(),
      createSoftLimiterModel({ gainDb: 10 }),
      createPolynomialModel({ coefficients: [[[1, 0], [0, 0], [-0.1, 0.02]], [[0.1, 0], [0, 0], [0, 0]]], maxInputAmplitude: 3 }),
    ];
    for (const model of models) {
      for (const target of [3, 6, 10]) {
        const { outputIq, drive } = amplifyAtDrive(model, signal, { reference: 'obo', backoffDb: target });
        const measured = 10 * Math.log10(model.outputSaturationAmplitude ** 2 / meanPower(outputIq));
        expect(Math.abs(measured - target), `${model.description} OBO ${target} (seed ${TEST_SEED})`).toBeLessThan(toleranceDb);
        expect(drive.oboDb).toBeCloseTo(target, 3);
      }
    }
  });

  it('reports OBO ≈ IBO for a limiter at large back-off (common practice)', () => {
    const point = solveDrive(createSoftLimiterModel(), signal, { reference: 'obo', backoffDb: 20 });
    expect(Math.abs(point.iboDb - 20)).toBeLessThan(0.01);
  });

  it('explains an OBO below what a folding-back TWT can reach', () => {
    let caught: unknown;
    try {
      solveDrive(createSalehModel(), signal, { reference: 'obo', backoffDb: 0.2 });
    } catch (err) {
      caught = err;
    }
    expect(caught).toBeInstanceOf(DspError);
    expect((caught as DspError).message).toMatch(/least reachable OBO is \d+\.\d+ dB/);
  });

  it('samples AM/AM and AM/PM curves for plotting; Rapp p = 2 compresses 1 dB 1.165 dB below r_sat', () => {
    const curves = computeAmplifierCurves(createRappModel({ smoothness: 2 }), -30, 10, 401);
    expect(curves.inputDbRelSat.length).toBe(401);
    expect(curves.gainCompressionDb[0]!).toBeCloseTo(0, 3);
    // 1 dB compression: (1 + u⁴)^(1/4) = 10^(1/20) → u⁴ = 10^0.2 − 1: 20·log10 u = 5·log10(10^0.2 − 1) = −1.165 dB (derived).
    expect(curves.inputP1dbRelSatDb).toBeCloseTo(5 * Math.log10(10 ** 0.2 - 1), 1);
    expect(curves.inputP1dbRelSatDb).toBeCloseTo(-1.165, 1);
    expect(curves.outputDbRelSat[400]!).toBeLessThan(0);
  });
});
