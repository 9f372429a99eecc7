import { expect } from 'vitest';

/** Asserts |actual[i] − expected[i]| ≤ absTol for every i, reporting the worst index. */
export function expectCloseArray(
  actual: ArrayLike<number>,
  expected: ArrayLike<number>,
  absTol: number,
  what = 'array',
): void {
  expect(actual.length, `${what} length`).toBe(expected.length);
  let worst = 0;
  let worstIndex = -1;
  for (let i = 0; i < actual.length; i++) {
    const err = Math.abs(actual[i]! - expected[i]!);
    if (!(err <= worst)) {
      worst = err;
      worstIndex = i;
    }
  }
  expect(
    worst,
    `${what}: worst error ${worst} at index ${worstIndex} (actual ${actual[worstIndex]}, expected ${expected[worstIndex]})`,
  ).toBeLessThanOrEqual(absTol);
}

/** Largest |a[i]| over an array, for relative tolerances. */
export function maxAbs(values: ArrayLike<number>): number {
  let m = 0;
  for (let i = 0; i < values.length; i++) m = Math.max(m, Math.abs(values[i]!));
  return m;
}
