import { DspError } from '../../src/dsp/errors';

/** Runs `run` and returns the DspError it throws; fails the test when it throws nothing or something else. */
export function dspErrorOf(run: () => unknown): DspError {
  try {
    run();
  } catch (err) {
    if (err instanceof DspError) return err;
    throw err;
  }
  throw new Error('expected a DspError, but nothing was thrown');
}
