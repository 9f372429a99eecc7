import { describe, expect, it } from 'vitest';
import { solveBackoff, type BackoffPoint } from '../../../src/dsp/backoff/backoffSolver';
import { DspError } from '../../../src/dsp/errors';

/**
 * Synthetic measured curves (a stand-in for the real metrics, as the solver only sees numbers): EVM falls and ACLR rises
 * with back-off b. EVM(b) = evm0·10^(−b/kEvm) %, ACLR(b) = aclr0 + slope·b dB (shapes typical of a compressing PA,
 * common practice). Each evaluation is counted.
 */
function syntheticCurve(evm0: number, kEvm: number, aclr0: number, slope: number) {
  let evaluations = 0;
  const at = (b: number): BackoffPoint => {
    evaluations++;
    return {
      backoffDb: b,
      iboDb: b - 1,
      oboDb: b,
      evmRmsPercent: evm0 * 10 ** (-b / kEvm),
      evmStandardErrorPercent: 0,
      aclrDb: { adjLower: aclr0 + slope * b, adjUpper: aclr0 + 0.5 + slope * b },
    };
  };
  const grid = Array.from({ length: 13 }, (_, i) => at(i));
  return { at, grid, count: () => evaluations };
}

const toleranceDb = 0.05;

describe('back-off solver: least back-off meeting every limit, by bracketing and bisection', () => {
  it('lands on the curve where the binding limit is met, within its tolerance', () => {
    const c = syntheticCurve(40, 10, 20, 1.5);
    // EVM ≤ 8 % needs b ≥ 10·log10(5) = 6.99 dB; ACLR ≥ 30 dB needs b ≥ 6.67 dB: EVM binds.
    const s = solveBackoff(c.grid, c.at, { evmPercent: 8, aclrDb: { adjLower: 30, adjUpper: 30 } }, toleranceDb);
    expect(s.status).toBe('solved');
    expect(s.limitingMetric).toBe('evm');
    const exact = 10 * Math.log10(5);
    expect(s.requiredBackoffDb!).toBeGreaterThanOrEqual(exact);
    expect(s.requiredBackoffDb! - exact).toBeLessThanOrEqual(toleranceDb);
    expect(s.bracketDb![0]).toBeLessThan(exact);
    expect(s.bisectionUncertaintyDb!).toBeLessThanOrEqual(toleranceDb / 2);
    expect(s.point!.evmRmsPercent).toBeLessThanOrEqual(8);
    expect(s.bisectionPoints.length).toBe(c.count() - 13);
  });

  it('moves the right way when a limit tightens or loosens, and switches the limiting metric', () => {
    const c = syntheticCurve(40, 10, 20, 1.5);
    const solve = (evm: number, aclr: number) => solveBackoff(c.grid, c.at, { evmPercent: evm, aclrDb: { adjLower: aclr, adjUpper: aclr } }, toleranceDb);
    const base = solve(8, 30);
    expect(solve(5, 30).requiredBackoffDb!).toBeGreaterThan(base.requiredBackoffDb!);
    expect(solve(12, 30).requiredBackoffDb!).toBeLessThan(base.requiredBackoffDb!);
    const aclrBound = solve(12, 33);
    expect(aclrBound.limitingMetric).toBe('aclr');
    expect(aclrBound.limitingChannel).toBe('adjLower'); // the lower channel is 0.5 dB worse
    expect(aclrBound.requiredBackoffDb! - (33 - 20) / 1.5).toBeLessThanOrEqual(toleranceDb);
  });

  it('moves the right way when the amplifier gets more linear (ACLR slope steeper, EVM falls faster)', () => {
    const soft = syntheticCurve(40, 10, 20, 1.5);
    const linear = syntheticCurve(40, 7, 22, 2);
    const limits = { evmPercent: 8, aclrDb: { adjLower: 30, adjUpper: 30 } };
    expect(solveBackoff(linear.grid, linear.at, limits).requiredBackoffDb!).toBeLessThan(solveBackoff(soft.grid, soft.at, limits).requiredBackoffDb!);
  });

  it('turns the limiting metric’s standard error into back-off uncertainty through its slope', () => {
    const c = syntheticCurve(40, 10, 20, 1.5);
    const noisy = (b: number): BackoffPoint => ({ ...c.at(b), evmStandardErrorPercent: 0.1 * c.at(b).evmRmsPercent });
    const grid = c.grid.map((p) => noisy(p.backoffDb));
    const s = solveBackoff(grid, noisy, { evmPercent: 8 }, toleranceDb);
    // Margin slope is 20/k = 2 dB per dB; a 10 % error is 0.83 dB of margin: 0.41 dB of back-off (derived).
    expect(s.statisticalUncertaintyDb!).toBeCloseTo((20 * Math.log10(1.1)) / 2, 2);
    expect(s.uncertaintyDb!).toBeGreaterThan(s.statisticalUncertaintyDb!);
  });

  it('says when the answer is below or beyond the swept range, and needs a limit', () => {
    const c = syntheticCurve(40, 10, 20, 1.5);
    expect(solveBackoff(c.grid, c.at, { evmPercent: 50 }).status).toBe('below-range');
    const far = solveBackoff(c.grid, c.at, { evmPercent: 0.01 });
    expect(far.status).toBe('not-reached');
    expect(far.requiredBackoffDb).toBeNull();
    expect(far.message).toMatch(/Sweep further/);
    expect(() => solveBackoff(c.grid, c.at, {})).toThrow(DspError);
    expect(() => solveBackoff(c.grid, c.at, { aclrDb: { nope: 30 } })).toThrow(/"nope"/);
  });

  it('picks the least back-off from which every larger one passes, ignoring an isolated lucky point', () => {
    const c = syntheticCurve(40, 10, 20, 1.5);
    const lucky = c.grid.map((p) => (p.backoffDb === 3 ? { ...p, evmRmsPercent: 1 } : p));
    expect(solveBackoff(lucky, c.at, { evmPercent: 8 }).requiredBackoffDb!).toBeGreaterThan(6.9);
  });
});
