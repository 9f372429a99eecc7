/** Timing helpers for the bench (wall clock, warm code, best round: noise on a shared machine only adds time). */

/** Best per-call time in µs of `fn` over `rounds` rounds of at least `roundMs` each, after a warm-up. */
export function bestMicros(fn: () => void, rounds = 11, roundMs = 25): number {
  const warmUntil = performance.now() + 3 * roundMs;
  let calls = 0;
  while (performance.now() < warmUntil || calls < 20) {
    fn();
    calls++;
  }
  // Calls per round so one round lasts about roundMs.
  const perRound = Math.max(1, Math.round((calls * roundMs) / (3 * roundMs)));
  let best = Number.POSITIVE_INFINITY;
  for (let r = 0; r < rounds; r++) {
    const t0 = performance.now();
    for (let i = 0; i < perRound; i++) fn();
    best = Math.min(best, ((performance.now() - t0) * 1000) / perRound);
  }
  return best;
}

/** Formats a number with `digits` significant figures, right-aligned to `width`. */
export function fmt(value: number | null | undefined, width: number, digits = 3): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return '—'.padStart(width);
  const text = Math.abs(value) >= 10 ** digits ? Math.round(value).toString() : value.toPrecision(digits);
  return text.padStart(width);
}

/** Prints a table: header row, rule, rows; columns right-aligned except the first. */
export function printTable(header: string[], rows: string[][]): void {
  const widths = header.map((h, c) => Math.max(h.length, ...rows.map((r) => r[c]!.length)));
  const line = (cells: string[]) => cells.map((cell, c) => (c === 0 ? cell.padEnd(widths[c]!) : cell.padStart(widths[c]!))).join('  ');
  console.log(line(header));
  console.log(widths.map((w) => '-'.repeat(w)).join('  '));
  for (const r of rows) console.log(line(r));
}
