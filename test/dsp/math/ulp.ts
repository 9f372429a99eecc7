/** Distance in units in the last place between two doubles of the same sign (0 for identical bits, NaN = NaN). */
export function ulpDistance(a: number, b: number): number {
  if (Object.is(a, b) || (a !== a && b !== b)) return 0;
  if (a !== a || b !== b) return Number.POSITIVE_INFINITY;
  return Math.abs(Number(orderedBits(a) - orderedBits(b)));
}

const f64 = new Float64Array(1);
const i64 = new BigInt64Array(f64.buffer);

/** Bits of x as an integer that increases with x (negative doubles mirrored), so neighbours differ by 1. */
function orderedBits(x: number): bigint {
  f64[0] = x;
  const b = i64[0]!;
  return b < 0n ? -(b & 0x7fffffffffffffffn) : b;
}

/** Seeded uniform numbers in [0, 1) (Park–Miller minimal standard LCG, 48271 multiplier; from memory). */
export function createUniform(seed: number): () => number {
  let state = (Math.abs(Math.trunc(seed)) % 2147483646) + 1;
  return () => {
    state = (state * 48271) % 2147483647;
    return (state - 1) / 2147483646;
  };
}

/** Largest ulp distance of f from reference over `inputs`, with the worst input. */
export function maxUlp(inputs: readonly number[], f: (x: number) => number, reference: (x: number) => number): { ulp: number; at: number } {
  let worst = { ulp: 0, at: Number.NaN };
  for (const x of inputs) {
    const u = ulpDistance(f(x), reference(x));
    if (u > worst.ulp) worst = { ulp: u, at: x };
  }
  return worst;
}
