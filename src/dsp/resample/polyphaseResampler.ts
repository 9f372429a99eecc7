import { assertLength, DspError } from '../errors';
import type { ResamplerDesign } from './resamplerDesign';

/**
 * Streaming rational resampler that treats its input x[0…N−1] as one period of a loop (circular filtering): output m is
 *   y[m] = Σ_q h[p + qL] · x[(b − q) mod N],  t = m·M + D,  b = ⌊t / L⌋,  p = t − b·L,
 * the polyphase form of upsampling by L, filtering with the prototype h (delay D = (K − 1)/2 removed, so y[0] lines up
 * with x[0]) and keeping every M-th sample (Oppenheim & Schafer, Discrete-Time Signal Processing, 3rd ed., §4.7.3;
 * Crochiere & Rabiner, Multirate Digital Signal Processing, 1983, ch. 3). There are ⌊N·L/M⌋ outputs. Because the
 * indices wrap, a file made of the outputs loops without a filter transient at the seam.
 *
 * Samples before x[0] come from the tail of the record. Give `historyIq` (the last Q samples, from an earlier pass)
 * to get the outputs strictly in order; without it the resampler starts at output `firstOutput` and `leadingIq()`
 * returns outputs 0…firstOutput−1 once `finish()` has seen the tail.
 */
export interface CircularResampler {
  readonly design: ResamplerDesign;
  readonly numInputSamples: number;
  readonly numOutputSamples: number;
  /** First output `push` produces: 0 with history, else the first that needs no sample before x[0]. */
  readonly firstOutput: number;
  /** Appends input samples (interleaved) and returns every output that became computable. */
  push(chunkIq: Float64Array): Float64Array;
  /** After all N input samples: wraps to the head of the record and returns the remaining outputs. */
  finish(): Float64Array;
  /** After `finish`: the last Q input samples x[N−Q…N−1] (wrapped when N < Q), to prime a later pass. */
  tailIq(): Float64Array;
  /** After `finish`, without history: outputs 0…firstOutput−1. */
  leadingIq(): Float64Array;
}

/** Number of input samples before x[0] a resampler needs as history (Q, the taps per branch). */
export function historyLengthSamples(design: ResamplerDesign): number {
  return design.tapsPerPhase;
}

/** Output count ⌊N·L/M⌋ of a circular resampler fed N samples. */
export function resampledLengthSamples(design: ResamplerDesign, numInputSamples: number): number {
  return Math.floor((numInputSamples * design.up) / design.down);
}

/**
 * Opens a circular resampler for an N-sample record.
 * @param historyIq x[N−Q…N−1] interleaved (2Q values), or undefined to defer the first outputs
 */
export function createCircularResampler(design: ResamplerDesign, numInputSamples: number, historyIq?: Float64Array): CircularResampler {
  const { up, down, tapsPerPhase: q } = design;
  const d = design.delayInterpolatedSamples;
  const n = numInputSamples;
  if (!Number.isInteger(n) || n < 1) throw new DspError('INTERNAL', `Resampler needs at least one input sample; got ${n}.`);
  if (historyIq) assertLength(historyIq, 2 * q, 'Resampler history');
  const numOut = resampledLengthSamples(design, n);
  const baseOf = (m: number): number => Math.floor((m * down + d) / up);
  const firstOutput = historyIq ? 0 : Math.min(numOut, Math.max(0, Math.ceil(((q - 1) * up - d) / down)));
  const lastBase = numOut > 0 ? baseOf(numOut - 1) : n - 1;
  const headNeed = Math.max(q, lastBase - n + 1, 1);
  const headLen = Math.min(n, headNeed);
  const headIq = new Float64Array(2 * headLen);
  const ringIq = new Float64Array(2 * q);
  let ringFill = 0;
  let seen = 0;
  let finished = false;
  // The window holds samples [bufStart, bufStart + bufLen) by absolute index.
  let buf = new Float64Array(2 * Math.max(4 * q, 1024));
  let bufStart = 0;
  let bufLen = 0;
  if (historyIq) {
    buf.set(historyIq, 0);
    bufStart = -q;
    bufLen = q;
  }
  let nextOut = firstOutput;

  const append = (chunkIq: Float64Array): void => {
    const count = chunkIq.length / 2;
    // Drop what no future output needs, then grow if still short.
    const need = nextOut < numOut ? baseOf(nextOut) - q + 1 : bufStart + bufLen;
    const keepFrom = Math.max(bufStart, Math.min(need, bufStart + bufLen));
    const drop = keepFrom - bufStart;
    if (drop > 0) {
      buf.copyWithin(0, 2 * drop, 2 * bufLen);
      bufLen -= drop;
      bufStart = keepFrom;
    }
    if (2 * (bufLen + count) > buf.length) {
      const bigger = new Float64Array(2 * Math.max(2 * (bufLen + count), 1024));
      bigger.set(buf.subarray(0, 2 * bufLen));
      buf = bigger;
    }
    buf.set(chunkIq, 2 * bufLen);
    bufLen += count;
  };

  const drain = (): Float64Array => {
    const end = bufStart + bufLen;
    // Outputs whose newest input index b(m) is already in the window.
    let mEnd = Math.floor((end * up - 1 - d) / down) + 1;
    mEnd = Math.min(Math.max(mEnd, nextOut), numOut);
    const out = new Float64Array(2 * (mEnd - nextOut));
    computeOutputs(design, buf, bufStart, nextOut, mEnd, out);
    nextOut = mEnd;
    return out;
  };

  const circularSample = (index: number, outIq: Float64Array, at: number): void => {
    // x[index mod N] from the head or the tail ring (both hold it whenever it is asked for).
    const i = ((index % n) + n) % n;
    if (i < headLen) {
      outIq[2 * at] = headIq[2 * i]!;
      outIq[2 * at + 1] = headIq[2 * i + 1]!;
      return;
    }
    const fromEnd = n - i;
    if (fromEnd > q) throw new DspError('INTERNAL', `Resampler asked for x[${i}], neither in the head nor the tail.`);
    const r = q - fromEnd;
    outIq[2 * at] = ringIq[2 * r]!;
    outIq[2 * at + 1] = ringIq[2 * r + 1]!;
  };

  return {
    design,
    numInputSamples: n,
    numOutputSamples: numOut,
    firstOutput,
    push(chunkIq) {
      if (finished) throw new DspError('INTERNAL', 'Resampler push() after finish().');
      const count = chunkIq.length / 2;
      if (seen + count > n) throw new DspError('INTERNAL', `Resampler fed ${seen + count} samples; the record has ${n}.`);
      if (seen < headLen) {
        const take = Math.min(headLen - seen, count);
        headIq.set(chunkIq.subarray(0, 2 * take), 2 * seen);
      }
      if (count >= q) {
        ringIq.set(chunkIq.subarray(2 * (count - q)));
      } else {
        ringIq.copyWithin(0, 2 * count);
        ringIq.set(chunkIq, 2 * (q - count));
      }
      ringFill = Math.min(q, ringFill + count);
      seen += count;
      append(chunkIq);
      return drain();
    },
    finish() {
      if (seen !== n) throw new DspError('INTERNAL', `Resampler finished after ${seen} of ${n} samples.`);
      finished = true;
      const extra = Math.max(0, lastBase - n + 1);
      const wrapIq = new Float64Array(2 * extra);
      for (let k = 0; k < extra; k++) circularSample(n + k, wrapIq, k);
      append(wrapIq);
      return drain();
    },
    tailIq() {
      if (!finished) throw new DspError('INTERNAL', 'Resampler tailIq() before finish().');
      if (ringFill === q) return ringIq.slice();
      const out = new Float64Array(2 * q);
      for (let k = 0; k < q; k++) circularSample(n - q + k, out, k);
      return out;
    },
    leadingIq() {
      if (!finished) throw new DspError('INTERNAL', 'Resampler leadingIq() before finish().');
      if (firstOutput === 0) return new Float64Array(0);
      // Window over x[−Q … Q−1] by circular index: outputs before firstOutput have b(m) ≤ Q − 2.
      const span = 2 * q;
      const win = new Float64Array(2 * span);
      const tail = this.tailIq();
      for (let k = 0; k < span; k++) {
        const idx = k - q;
        if (idx < 0) {
          win[2 * k] = tail[2 * (q + idx)]!;
          win[2 * k + 1] = tail[2 * (q + idx) + 1]!;
        } else {
          circularSample(idx, win, k);
        }
      }
      const out = new Float64Array(2 * firstOutput);
      computeOutputs(design, win, -q, 0, firstOutput, out);
      return out;
    },
  };
}

/**
 * y[m] for m = mFrom…mTo−1 into outIq (2·(mTo − mFrom) values) from a window whose sample 0 is x[winStart].
 * The caller guarantees the window covers b(m) − Q + 1 … b(m) for every m asked.
 */
function computeOutputs(design: ResamplerDesign, winIq: Float64Array, winStart: number, mFrom: number, mTo: number, outIq: Float64Array): void {
  const { up, down, tapsPerPhase: q, phaseTaps } = design;
  const d = design.delayInterpolatedSamples;
  for (let m = mFrom; m < mTo; m++) {
    const t = m * down + d;
    const b = Math.floor(t / up);
    const p = t - b * up;
    const tapBase = p * q;
    let x = 2 * (b - winStart);
    let re = 0;
    let im = 0;
    for (let k = 0; k < q; k++) {
      const h = phaseTaps[tapBase + k]!;
      re += h * winIq[x]!;
      im += h * winIq[x + 1]!;
      x -= 2;
    }
    const o = 2 * (m - mFrom);
    outIq[o] = re;
    outIq[o + 1] = im;
  }
}

/** Resamples a whole record held in memory, circularly (see CircularResampler). Returns ⌊N·L/M⌋ samples. */
export function resampleCircular(design: ResamplerDesign, iq: Float64Array): Float64Array {
  const n = iq.length / 2;
  const q = design.tapsPerPhase;
  const history = new Float64Array(2 * q);
  for (let k = 0; k < q; k++) {
    const i = (((n - q + k) % n) + n) % n;
    history[2 * k] = iq[2 * i]!;
    history[2 * k + 1] = iq[2 * i + 1]!;
  }
  const r = createCircularResampler(design, n, history);
  const a = r.push(iq);
  const b = r.finish();
  const out = new Float64Array(a.length + b.length);
  out.set(a);
  out.set(b, a.length);
  return out;
}
