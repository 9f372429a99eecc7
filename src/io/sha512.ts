/**
 * Incremental SHA-512 (FIPS 180-4, "Secure Hash Standard", NIST 2015, §6.4) in plain TypeScript, with no platform
 * APIs, so the CLI and the browser hash streamed exports with the same code. 64-bit words are held as (hi, lo) pairs of
 * 32-bit integers.
 *
 * The constants are computed rather than typed in: K_t is the first 64 bits of the fractional part of the cube root of
 * the t-th prime (§4.2.3) and H(0) the same for the square roots of the first 8 primes (§5.3.5), both found exactly with
 * integer roots in BigInt.
 */
export interface Sha512 {
  /** Adds bytes to the message; returns the same hasher. */
  update(bytes: Uint8Array): Sha512;
  /** Finishes the message and returns the 64-byte digest; the hasher may not be updated afterwards. */
  digest(): Uint8Array;
  /** `digest()` as 128 lower-case hex characters. */
  digestHex(): string;
}

const PRIMES = firstPrimes(80);
const TWO64 = 1n << 64n;
/** K_0…K_79 as hi, lo pairs (160 values). */
const K = new Int32Array(160);
PRIMES.forEach((p, t) => setWord(K, t, integerRoot(BigInt(p) << 192n, 3n) % TWO64));
const H0 = new Int32Array(16);
PRIMES.slice(0, 8).forEach((p, t) => setWord(H0, t, integerRoot(BigInt(p) << 128n, 2n) % TWO64));

export function createSha512(): Sha512 {
  const h = H0.slice();
  const w = new Int32Array(160);
  const block = new Uint8Array(128);
  let blockFill = 0;
  let totalBytes = 0;
  let done = false;

  const hasher: Sha512 = {
    update(bytes) {
      if (done) throw new Error('SHA-512: update() after digest().');
      totalBytes += bytes.length;
      let i = 0;
      if (blockFill > 0) {
        const take = Math.min(128 - blockFill, bytes.length);
        block.set(bytes.subarray(0, take), blockFill);
        blockFill += take;
        i = take;
        if (blockFill === 128) {
          compress(h, w, block, 0);
          blockFill = 0;
        }
      }
      for (; i + 128 <= bytes.length; i += 128) compress(h, w, bytes, i);
      if (i < bytes.length) {
        block.set(bytes.subarray(i), 0);
        blockFill = bytes.length - i;
      }
      return hasher;
    },
    digest() {
      if (done) throw new Error('SHA-512: digest() called twice.');
      done = true;
      // Padding (§5.1.2): 0x80, zeros, then the message length in bits as a 128-bit big-endian number.
      const bitsHi = Math.floor(totalBytes / 0x20000000);
      const bitsLo = (totalBytes * 8) >>> 0;
      const pad = new Uint8Array(blockFill < 112 ? 128 - blockFill : 256 - blockFill);
      pad[0] = 0x80;
      const v = new DataView(pad.buffer);
      v.setUint32(pad.length - 8, bitsHi >>> 0, false);
      v.setUint32(pad.length - 4, bitsLo, false);
      done = false;
      hasher.update(pad);
      done = true;
      const out = new Uint8Array(64);
      const ov = new DataView(out.buffer);
      for (let i = 0; i < 16; i++) ov.setInt32(4 * i, h[i]!, false);
      return out;
    },
    digestHex() {
      return Array.from(hasher.digest(), (b) => b.toString(16).padStart(2, '0')).join('');
    },
  };
  return hasher;
}

/** SHA-512 of one byte array, as hex. */
export function sha512Hex(bytes: Uint8Array): string {
  return createSha512().update(bytes).digestHex();
}

/**
 * The compression function (§6.4.2) on the 128-byte block at `offset`. Sums of several 64-bit words are carried in
 * 16-bit limbs (a, b, c, d from the low to the high end) so every intermediate stays a small integer.
 */
function compress(h: Int32Array, w: Int32Array, bytes: Uint8Array, offset: number): void {
  for (let t = 0; t < 16; t++) {
    const j = offset + 8 * t;
    w[2 * t] = (bytes[j]! << 24) | (bytes[j + 1]! << 16) | (bytes[j + 2]! << 8) | bytes[j + 3]!;
    w[2 * t + 1] = (bytes[j + 4]! << 24) | (bytes[j + 5]! << 16) | (bytes[j + 6]! << 8) | bytes[j + 7]!;
  }
  let a = 0, b = 0, c = 0, d = 0;
  for (let t = 16; t < 80; t++) {
    // W[t] = σ1(W[t−2]) + W[t−7] + σ0(W[t−15]) + W[t−16]; σ1 = ROTR19 ⊕ ROTR61 ⊕ SHR6, σ0 = ROTR1 ⊕ ROTR8 ⊕ SHR7.
    const xh = w[2 * (t - 2)]!;
    const xl = w[2 * (t - 2) + 1]!;
    const s1h = ((xh >>> 19) | (xl << 13)) ^ ((xl >>> 29) | (xh << 3)) ^ (xh >>> 6);
    const s1l = ((xl >>> 19) | (xh << 13)) ^ ((xh >>> 29) | (xl << 3)) ^ ((xl >>> 6) | (xh << 26));
    const yh = w[2 * (t - 15)]!;
    const yl = w[2 * (t - 15) + 1]!;
    const s0h = ((yh >>> 1) | (yl << 31)) ^ ((yh >>> 8) | (yl << 24)) ^ (yh >>> 7);
    const s0l = ((yl >>> 1) | (yh << 31)) ^ ((yl >>> 8) | (yh << 24)) ^ ((yl >>> 7) | (yh << 25));
    const h7 = w[2 * (t - 7)]!, l7 = w[2 * (t - 7) + 1]!, h16 = w[2 * (t - 16)]!, l16 = w[2 * (t - 16) + 1]!;
    a = (s1l & 0xffff) + (l7 & 0xffff) + (s0l & 0xffff) + (l16 & 0xffff);
    b = (s1l >>> 16) + (l7 >>> 16) + (s0l >>> 16) + (l16 >>> 16);
    c = (s1h & 0xffff) + (h7 & 0xffff) + (s0h & 0xffff) + (h16 & 0xffff);
    d = (s1h >>> 16) + (h7 >>> 16) + (s0h >>> 16) + (h16 >>> 16);
    b += a >>> 16;
    c += b >>> 16;
    d += c >>> 16;
    w[2 * t] = (c & 0xffff) | (d << 16);
    w[2 * t + 1] = (a & 0xffff) | (b << 16);
  }
  let ah = h[0]!, al = h[1]!, bh = h[2]!, bl = h[3]!, ch = h[4]!, cl = h[5]!, dh = h[6]!, dl = h[7]!;
  let eh = h[8]!, el = h[9]!, fh = h[10]!, fl = h[11]!, gh = h[12]!, gl = h[13]!, hh = h[14]!, hl = h[15]!;
  for (let t = 0; t < 80; t++) {
    // T1 = h + Σ1(e) + Ch(e,f,g) + K_t + W_t; Σ1 = ROTR14 ⊕ ROTR18 ⊕ ROTR41, Ch = (e ∧ f) ⊕ (¬e ∧ g).
    const S1h = ((eh >>> 14) | (el << 18)) ^ ((eh >>> 18) | (el << 14)) ^ ((el >>> 9) | (eh << 23));
    const S1l = ((el >>> 14) | (eh << 18)) ^ ((el >>> 18) | (eh << 14)) ^ ((eh >>> 9) | (el << 23));
    const chh = (eh & fh) ^ (~eh & gh);
    const chl = (el & fl) ^ (~el & gl);
    const kh = K[2 * t]!, kl = K[2 * t + 1]!, wh = w[2 * t]!, wl = w[2 * t + 1]!;
    a = (hl & 0xffff) + (S1l & 0xffff) + (chl & 0xffff) + (kl & 0xffff) + (wl & 0xffff);
    b = (hl >>> 16) + (S1l >>> 16) + (chl >>> 16) + (kl >>> 16) + (wl >>> 16);
    c = (hh & 0xffff) + (S1h & 0xffff) + (chh & 0xffff) + (kh & 0xffff) + (wh & 0xffff);
    d = (hh >>> 16) + (S1h >>> 16) + (chh >>> 16) + (kh >>> 16) + (wh >>> 16);
    b += a >>> 16;
    c += b >>> 16;
    d += c >>> 16;
    const t1h = (c & 0xffff) | (d << 16);
    const t1l = (a & 0xffff) | (b << 16);
    // T2 = Σ0(a) + Maj(a,b,c); Σ0 = ROTR28 ⊕ ROTR34 ⊕ ROTR39, Maj = (a ∧ b) ⊕ (a ∧ c) ⊕ (b ∧ c).
    const S0h = ((ah >>> 28) | (al << 4)) ^ ((al >>> 2) | (ah << 30)) ^ ((al >>> 7) | (ah << 25));
    const S0l = ((al >>> 28) | (ah << 4)) ^ ((ah >>> 2) | (al << 30)) ^ ((ah >>> 7) | (al << 25));
    const mh = (ah & bh) ^ (ah & ch) ^ (bh & ch);
    const ml = (al & bl) ^ (al & cl) ^ (bl & cl);
    hh = gh; hl = gl; gh = fh; gl = fl; fh = eh; fl = el;
    // e = d + T1
    a = (dl & 0xffff) + (t1l & 0xffff);
    b = (dl >>> 16) + (t1l >>> 16);
    c = (dh & 0xffff) + (t1h & 0xffff);
    d = (dh >>> 16) + (t1h >>> 16);
    b += a >>> 16;
    c += b >>> 16;
    d += c >>> 16;
    eh = (c & 0xffff) | (d << 16);
    el = (a & 0xffff) | (b << 16);
    dh = ch; dl = cl; ch = bh; cl = bl; bh = ah; bl = al;
    // a = T1 + T2
    a = (t1l & 0xffff) + (S0l & 0xffff) + (ml & 0xffff);
    b = (t1l >>> 16) + (S0l >>> 16) + (ml >>> 16);
    c = (t1h & 0xffff) + (S0h & 0xffff) + (mh & 0xffff);
    d = (t1h >>> 16) + (S0h >>> 16) + (mh >>> 16);
    b += a >>> 16;
    c += b >>> 16;
    d += c >>> 16;
    ah = (c & 0xffff) | (d << 16);
    al = (a & 0xffff) | (b << 16);
  }
  addWord(h, 0, ah, al);
  addWord(h, 1, bh, bl);
  addWord(h, 2, ch, cl);
  addWord(h, 3, dh, dl);
  addWord(h, 4, eh, el);
  addWord(h, 5, fh, fl);
  addWord(h, 6, gh, gl);
  addWord(h, 7, hh, hl);
}

function addWord(h: Int32Array, i: number, xh: number, xl: number): void {
  const lo = (h[2 * i + 1]! >>> 0) + (xl >>> 0);
  h[2 * i] = (h[2 * i]! + xh + ((lo / 0x100000000) | 0)) | 0;
  h[2 * i + 1] = lo | 0;
}

function setWord(target: Int32Array, index: number, value: bigint): void {
  target[2 * index] = Number(BigInt.asIntN(32, value >> 32n));
  target[2 * index + 1] = Number(BigInt.asIntN(32, value));
}

/** ⌊x^(1/k)⌋ by Newton's method from above (exact for BigInt). */
function integerRoot(x: bigint, k: bigint): bigint {
  let r = 1n << (BigInt(x.toString(2).length) / k + 1n);
  for (;;) {
    const next = ((k - 1n) * r + x / r ** (k - 1n)) / k;
    if (next >= r) return r;
    r = next;
  }
}

function firstPrimes(count: number): number[] {
  const out: number[] = [];
  for (let n = 2; out.length < count; n++) if (out.every((p) => n % p !== 0)) out.push(n);
  return out;
}
