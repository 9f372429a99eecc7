import { time } from './_t';
const n = 8192; const p = new Float32Array(8 * n).map(() => Math.random());
function a(power: Float32Array, base: number) { let peak = 0, sum = 0; for (let i = base; i < base + n; i++) { const v = power[i]!; sum += v; if (v > peak) peak = v; } return peak / sum; }
function b(power: Float32Array, base: number) { let p0 = 0, p1 = 0, s0 = 0, s1 = 0; for (let i = base; i < base + n; i += 2) { const v = power[i]!, w = power[i+1]!; s0 += v; s1 += w; if (v > p0) p0 = v; if (w > p1) p1 = w; } return Math.max(p0, p1) / (s0 + s1); }
function c(power: Float32Array, base: number) { let p0 = 0, p1 = 0, p2 = 0, p3 = 0, s0 = 0, s1 = 0; for (let i = base; i < base + n; i += 4) { const v0 = power[i]!, v1 = power[i+1]!, v2 = power[i+2]!, v3 = power[i+3]!; s0 += v0 + v1; s1 += v2 + v3; p0 = v0 > p0 ? v0 : p0; p1 = v1 > p1 ? v1 : p1; p2 = v2 > p2 ? v2 : p2; p3 = v3 > p3 ? v3 : p3; } return Math.max(p0, p1, p2, p3) / (s0 + s1); }
function d(power: Float32Array, base: number) { let peak = 0, sum = 0; for (let i = base; i < base + n; i++) { const v = power[i]!; sum += v; peak = Math.max(peak, v); } return peak / sum; }
let k = 0;
time('a simple', () => { a(p, (k++ & 7) * n); }, 8);
time('b unroll2', () => { b(p, (k++ & 7) * n); }, 8);
time('c unroll4', () => { c(p, (k++ & 7) * n); }, 8);
time('d Math.max', () => { d(p, (k++ & 7) * n); }, 8);
time('a simple', () => { a(p, (k++ & 7) * n); }, 8);
