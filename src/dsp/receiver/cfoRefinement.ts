/**
 * Fine (residual) frequency offset from known elements, after the CP-based coarse estimate (two-stage estimation is
 * common practice; TS 36.101 Annex F also removes the frequency offset before measuring EVM). For each pilot symbol a and
 * the next pilot symbol b holding pilots on the same subcarriers, z_ab = Σ_k (Y_b X_b*)(Y_a X_a*)*; a phase advance of
 * ∠z_ab over t_b − t_a seconds is a frequency Δf_ab = ∠z_ab / (2π(t_b − t_a)). The pair estimates are averaged with
 * weights |z_ab|·(t_b − t_a). Unambiguous while |Δf|·(t_b − t_a) < ½ (e.g. |Δf| < 1 kHz for one DMRS per 0.5 ms slot).
 */
export function estimateResidualCfoHz(
  rxGridIq: Float64Array,
  pilotGridIq: Float64Array,
  pilotMask: Uint8Array,
  numSubcarriers: number,
  symbolTimesS: readonly number[],
): number {
  const k = numSubcarriers;
  const numSymbols = symbolTimesS.length;
  const keys: (string | undefined)[] = [];
  for (let l = 0; l < numSymbols; l++) {
    const positions: number[] = [];
    for (let sc = 0; sc < k; sc++) if (pilotMask[l * k + sc]) positions.push(sc);
    keys.push(positions.length > 0 ? positions.join(',') : undefined);
  }
  let weighted = 0;
  let weight = 0;
  for (let a = 0; a < numSymbols; a++) {
    if (keys[a] === undefined) continue;
    let b = a + 1;
    while (b < numSymbols && keys[b] !== keys[a]) b++;
    if (b >= numSymbols) continue;
    let zRe = 0;
    let zIm = 0;
    for (let sc = 0; sc < k; sc++) {
      if (!pilotMask[a * k + sc]) continue;
      const [aRe, aIm] = correlate(rxGridIq, pilotGridIq, 2 * (a * k + sc));
      const [bRe, bIm] = correlate(rxGridIq, pilotGridIq, 2 * (b * k + sc));
      zRe += bRe * aRe + bIm * aIm;
      zIm += bIm * aRe - bRe * aIm;
    }
    const dt = symbolTimesS[b]! - symbolTimesS[a]!;
    const magnitude = Math.hypot(zRe, zIm);
    if (magnitude === 0 || dt <= 0) continue;
    weighted += (Math.atan2(zIm, zRe) / (2 * Math.PI * dt)) * magnitude * dt;
    weight += magnitude * dt;
  }
  return weight > 0 ? weighted / weight : 0;
}

/** Y·X* at interleaved index e. */
function correlate(rxIq: Float64Array, pilotIq: Float64Array, e: number): [number, number] {
  const yRe = rxIq[e]!;
  const yIm = rxIq[e + 1]!;
  const xRe = pilotIq[e]!;
  const xIm = pilotIq[e + 1]!;
  return [yRe * xRe + yIm * xIm, yIm * xRe - yRe * xIm];
}
