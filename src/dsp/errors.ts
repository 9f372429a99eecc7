/**
 * Typed errors of the DSP engine. Messages are written for the person at the form: they name the
 * parameter, the value given and what is allowed.
 */
export type DspErrorCode =
  /** A configuration value is out of range or inconsistent, e.g. "numRb 120 exceeds the 100 RB grid of LTE 20 MHz". */
  | 'INVALID_CONFIG'
  /** A transform or block size the engine cannot handle, e.g. a DFT-spreading size 12·7 that TS 36.211 §5.3.3 forbids. */
  | 'UNSUPPORTED_SIZE'
  /** A caller-allocated buffer has the wrong length, e.g. an output of 2×2047 values for a 2048-point FFT. */
  | 'LENGTH_MISMATCH'
  /** An input file is malformed: truncated data, bad JSON, wrong datatype, checksum mismatch, NaN samples. */
  | 'INVALID_FILE'
  /** A broken invariant inside the engine; a bug, never the user's fault. */
  | 'INTERNAL';

export class DspError extends Error {
  readonly code: DspErrorCode;
  readonly details: Record<string, unknown> | undefined;

  constructor(code: DspErrorCode, message: string, details?: Record<string, unknown>) {
    super(message);
    this.name = 'DspError';
    this.code = code;
    this.details = details;
  }
}

/** Throws LENGTH_MISMATCH unless `buffer.length === expected`. `what` names the buffer in the message. */
export function assertLength(buffer: { length: number }, expected: number, what: string): void {
  if (buffer.length !== expected) {
    throw new DspError(
      'LENGTH_MISMATCH',
      `${what} has ${buffer.length} values but ${expected} are required.`,
      { actual: buffer.length, expected },
    );
  }
}

/**
 * Throws LENGTH_MISMATCH unless `buffer` holds whole complex samples: an even number of values, re and im of each
 * sample interleaved. For blocks that accept any number of samples.
 * @param what names the function and the buffer in the message, e.g. 'applyFractionalDelay outIq'
 */
export function assertWholeSamples(buffer: { length: number }, what: string): void {
  if (buffer.length % 2 !== 0) {
    throw new DspError(
      'LENGTH_MISMATCH',
      `${what} has ${buffer.length} values; allowed: an even number (2 per complex sample, re then im), e.g. ${buffer.length - 1} or ${buffer.length + 1}.`,
      { actual: buffer.length },
    );
  }
}

/**
 * Checks a sample-by-sample block's output buffer: LENGTH_MISMATCH unless it has `inIq.length` values ("`what`
 * output has …"), INTERNAL when it is the input buffer itself (no aliasing unless a block documents it).
 * @param what names the block in the messages, e.g. 'Amplifier'
 */
export function assertSeparateOutput(inIq: Float64Array, outIq: Float64Array, what: string): void {
  assertLength(outIq, inIq.length, `${what} output`);
  if (inIq === outIq) throw new DspError('INTERNAL', `${what} input and output must be different buffers.`);
}
