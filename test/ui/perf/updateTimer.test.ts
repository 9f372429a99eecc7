import { describe, expect, it } from 'vitest';
import { createUpdateTimer, UPDATE_MEASURE, type TimingApi } from '../../../src/ui/perf/updateTimer';

/** A timing API on a hand-driven clock, recording what the timer asks of it. */
function fakeTiming() {
  let nowMs = 0;
  const marks = new Map<string, number>();
  const measures: { name: string; durationMs: number }[] = [];
  const api: TimingApi = {
    mark: (name) => void marks.set(name, nowMs),
    measure: (name, start) => {
      const at = marks.get(start);
      if (at === undefined) return undefined;
      measures.push({ name, durationMs: nowMs - at });
      return nowMs - at;
    },
    clearMarks: (name) => void marks.delete(name),
  };
  return { api, measures, advance: (ms: number) => (nowMs += ms), marks };
}

describe('update timer', () => {
  it('measures from the change until the last plot on screen drew it', () => {
    const t = fakeTiming();
    const timer = createUpdateTimer(t.api);
    timer.register('time');
    timer.register('ccdf');
    timer.begin(1);
    t.advance(40);
    timer.rendered('time', 1);
    expect(t.measures).toEqual([]);
    t.advance(25);
    timer.rendered('ccdf', 1);
    expect(t.measures).toEqual([{ name: UPDATE_MEASURE, durationMs: 65 }]);
    expect(timer.last()).toEqual({ seq: 1, durationMs: 65 });
    expect(t.marks.size).toBe(0);
  });

  it('restarts on a newer change and ignores renders of older configurations', () => {
    const t = fakeTiming();
    const timer = createUpdateTimer(t.api);
    timer.register('a');
    timer.register('b');
    timer.begin(1);
    t.advance(10);
    timer.begin(2); // the user changed something again before the plots caught up
    timer.rendered('a', 1);
    timer.rendered('b', 1);
    expect(t.measures).toEqual([]);
    t.advance(30);
    timer.rendered('a', 2);
    timer.rendered('b', 2);
    expect(t.measures).toEqual([{ name: UPDATE_MEASURE, durationMs: 30 }]);
  });

  it('completes when a plot that would never report leaves the screen', () => {
    const t = fakeTiming();
    const timer = createUpdateTimer(t.api);
    const seen: number[] = [];
    timer.subscribe(({ durationMs }) => seen.push(durationMs));
    timer.register('a');
    timer.register('gone');
    timer.begin(5);
    t.advance(12);
    timer.rendered('a', 5);
    timer.unregister('gone');
    expect(seen).toEqual([12]);
  });
});
