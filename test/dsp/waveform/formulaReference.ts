/**
 * Direct evaluation of the standards' baseband sums, written independently of the engine (slow O(N·K) loops).
 * Time runs in samples of the output rate: t = n·Ts/os, so (t − N_CP·Ts)·Δf = (n − N_CP·os)/(N·os).
 * Angles are reduced with exact integer arithmetic before the trigonometry, so the reference itself is accurate.
 */

/** LTE uplink SC-FDMA, TS 36.211 §5.6: s(t) = Σ_{k=−K/2}^{K/2−1} a_{k+K/2} e^{j2π(k+1/2)Δf(t − N_CP·Ts)}. */
export function lteUplinkSymbol(gridRowIq: Float64Array, fftSize: number, cpBase: number, os: number): Float64Array {
  const numSc = gridRowIq.length / 2;
  return subcarrierSum(gridRowIq, fftSize, cpBase, os, (i) => 2 * (i - numSc / 2) + 1);
}

/**
 * LTE downlink OFDM, TS 36.211 §6.12: Σ_{k=−K/2}^{−1} a_{k+K/2} e^{j2πkΔf(t−N_CP Ts)} + Σ_{k=1}^{K/2} a_{k+K/2−1} e^{…}.
 * NR, TS 38.211 §5.3.1 with k0 = 0: Σ_{k=0}^{K−1} a_k e^{j2π(k − K/2)Δf(t − N_CP Tc − t_start)} (`dcNull` false).
 */
export function integerSubcarrierSymbol(
  gridRowIq: Float64Array,
  fftSize: number,
  cpBase: number,
  os: number,
  dcNull: boolean,
): Float64Array {
  const numSc = gridRowIq.length / 2;
  return subcarrierSum(gridRowIq, fftSize, cpBase, os, (i) => {
    const k = i - numSc / 2;
    return 2 * (dcNull && k >= 0 ? k + 1 : k);
  });
}

/**
 * s[n] = Σ_i a_i e^{j2π(k_i/2)(n − N_cp·os)/(N·os)} for n = 0 … (N_cp + N)·os − 1, where `twiceFrequencyOf(i)`
 * gives the whole number 2k_i (k_i in subcarriers, so half subcarriers are exact too). The angle is reduced
 * mod 2·N·os in integers before the trigonometry.
 */
function subcarrierSum(
  gridRowIq: Float64Array,
  fftSize: number,
  cpBase: number,
  os: number,
  twiceFrequencyOf: (i: number) => number,
): Float64Array {
  const numSc = gridRowIq.length / 2;
  const nOs = fftSize * os;
  const len = cpBase * os + nOs;
  const den = 2 * nOs;
  const out = new Float64Array(2 * len);
  for (let n = 0; n < len; n++) {
    let re = 0;
    let im = 0;
    for (let i = 0; i < numSc; i++) {
      const num = (((twiceFrequencyOf(i) * (n - cpBase * os)) % den) + den) % den;
      const angle = (2 * Math.PI * num) / den;
      const c = Math.cos(angle);
      const s = Math.sin(angle);
      re += gridRowIq[2 * i]! * c - gridRowIq[2 * i + 1]! * s;
      im += gridRowIq[2 * i]! * s + gridRowIq[2 * i + 1]! * c;
    }
    out[2 * n] = re;
    out[2 * n + 1] = im;
  }
  return out;
}

/**
 * NR CP lengths in Tc for symbol l of a subframe (TS 38.211 §5.3.1): N_u = 2048κ2^−μ; normal CP 144κ2^−μ + 16κ
 * at l = 0 and l = 7·2^μ, else 144κ2^−μ; extended 512κ2^−μ. κ = 64.
 */
export function nrCpTc(mu: number, l: number, extended: boolean): number {
  const kappa = 64;
  if (extended) return 512 * kappa * 2 ** -mu;
  return 144 * kappa * 2 ** -mu + (l === 0 || l === 7 * 2 ** mu ? 16 * kappa : 0);
}
