import { describe, expect, it } from 'vitest';
import { defaultAclrLimit, defaultEvmLimit, defaultEvmLimitFor } from '../../../src/dsp/backoff/limits';
import { lteMprAllowance, mprAllowanceFor, nrAllocationClass, nrMprAllowance } from '../../../src/dsp/backoff/mpr';
import { resolveNumerology } from '../../../src/dsp/numerology/numerology';

const lteUl = resolveNumerology({ standard: 'lte', link: 'uplink', bandwidthMHz: 10, cyclicPrefix: 'normal' });
const nrUl = resolveNumerology({ standard: 'nr', link: 'uplink', bandwidthMHz: 20, subcarrierSpacingKHz: 30, cyclicPrefix: 'normal' });
const nrDl = resolveNumerology({ standard: 'nr', link: 'downlink', bandwidthMHz: 20, subcarrierSpacingKHz: 30, cyclicPrefix: 'normal' });

describe('default EVM and ACLR limits (REFERENCE.md §5.4, §5.5)', () => {
  it('EVM per modulation: 17.5 / 12.5 / 8 / 3.5 %, π/2-BPSK 30 % in NR (TS 36.101 §6.5.2.1, TS 38.101-1 §6.4.2.1; from memory)', () => {
    expect(defaultEvmLimit(lteUl, 'qpsk')!.value).toBe(17.5);
    expect(defaultEvmLimit(lteUl, '16qam')!.value).toBe(12.5);
    expect(defaultEvmLimit(lteUl, '64qam')!.value).toBe(8);
    expect(defaultEvmLimit(lteUl, '256qam')!.value).toBe(3.5);
    expect(defaultEvmLimit(lteUl, 'pi/2-bpsk')).toBeUndefined();
    expect(defaultEvmLimit(nrUl, 'pi/2-bpsk')!.value).toBe(30);
    expect(defaultEvmLimit(nrUl, 'qpsk')!.source).toMatch(/38\.101-1/);
    // NR BS QPSK…256QAM, TS 38.104 Table 6.5.2.2-1 [S2].
    expect(['qpsk', '16qam', '64qam', '256qam'].map((m) => defaultEvmLimit(nrDl, m as 'qpsk')!.value)).toEqual([17.5, 12.5, 8, 3.5]);
    expect(defaultEvmLimitFor(lteUl, ['qpsk', '64qam']).value).toBe(8);
    expect(() => defaultEvmLimitFor(lteUl, ['bpsk'])).toThrow(/--evm-limit/);
  });

  it('ACLR: LTE UE 30 / 33 / 36 dB (TS 36.101 §6.6.2.3, from memory — verify), BS 45 dB (TS 36.104 §6.6.2 / 38.104 §6.6.3, from memory — verify)', () => {
    expect(defaultAclrLimit(lteUl, 'eutraLower')!.value).toBe(30);
    expect(defaultAclrLimit(lteUl, 'utra1Upper')!.value).toBe(33);
    expect(defaultAclrLimit(lteUl, 'utra2Lower')!.value).toBe(36);
    expect(defaultAclrLimit(lteUl, 'eutraLower')!.source).toMatch(/from memory — verify/);
    expect(defaultAclrLimit(nrDl, 'nr2Upper')!.value).toBe(45);
  });

  it('ACLR: NR UE PC3 NR_ACLR 30 dB (TS 38.101-1 §6.5.2.4.1), UTRA_ACLR1 33 / ACLR2 36 dB (§6.5.2.4.2) [S2, public summaries]', () => {
    expect(defaultAclrLimit(nrUl, 'nrUpper')).toEqual({ value: 30, source: 'TS 38.101-1 §6.5.2.4.1, power class 3 [S2]' });
    expect(defaultAclrLimit(nrUl, 'utra1Lower')).toEqual({ value: 33, source: 'TS 38.101-1 §6.5.2.4.2 [S2]' });
    expect(defaultAclrLimit(nrUl, 'utra2Upper')).toEqual({ value: 36, source: 'TS 38.101-1 §6.5.2.4.2 [S2]' });
  });
});

describe('MPR allowance as context (REFERENCE.md §5.6, values from memory — verify)', () => {
  it('LTE TS 36.101 Table 6.2.3-1: QPSK 0 / ≤1, 16QAM ≤1 / ≤2, 64QAM ≤2 / ≤3, 256QAM ≤5 around the per-BW RB thresholds', () => {
    // 10 MHz threshold 12 RB.
    expect(lteMprAllowance(10, 12, 'qpsk')!.maxMprDb).toBe(0);
    expect(lteMprAllowance(10, 13, 'qpsk')!.maxMprDb).toBe(1);
    expect(lteMprAllowance(10, 12, '16qam')!.maxMprDb).toBe(1);
    expect(lteMprAllowance(10, 50, '16qam')!.maxMprDb).toBe(2);
    expect(lteMprAllowance(10, 12, '64qam')!.maxMprDb).toBe(2);
    expect(lteMprAllowance(10, 50, '64qam')!.maxMprDb).toBe(3);
    expect(lteMprAllowance(20, 100, '256qam')!.maxMprDb).toBe(5);
    // Thresholds 5 / 4 / 8 / 12 / 16 / 18 RB for 1.4 … 20 MHz (REFERENCE.md §5.6).
    const thresholds: [number, number][] = [[1.4, 5], [3, 4], [5, 8], [10, 12], [15, 16], [20, 18]];
    for (const [bw, rb] of thresholds) {
      expect(lteMprAllowance(bw, rb, 'qpsk')!.maxMprDb).toBe(0);
      expect(lteMprAllowance(bw, rb + 1, 'qpsk')!.maxMprDb).toBe(1);
    }
    expect(lteMprAllowance(1.4, 6, 'qpsk')!.maxMprDb).toBe(1);
  });

  it('NR allocation classes follow TS 38.101-1 §6.2.2 [S, clause text of V19.6.0]: inner, edge and outer boundaries', () => {
    // N_RB 51, L_CRB 10: RB_start,low = 5, RB_start,high = 51 − 5 − 10 = 36.
    expect([4, 5, 36, 37].map((start) => nrAllocationClass(51, start, 10))).toEqual(['outer', 'inner', 'inner', 'outer']);
    // L_CRB ≤ ⌈N_RB/2⌉: 26 of 52 RB at RB_start 13 is inner (low 13 = high 13); 27 RB never is.
    expect(nrAllocationClass(52, 13, 26)).toBe('inner');
    expect(nrAllocationClass(52, 12, 27)).toBe('outer');
    // Edge: at most 2 RB at the lowermost or uppermost edge; 1 RB one RB in from the edge is inner (RB_start,low = 1).
    expect([nrAllocationClass(51, 0, 1), nrAllocationClass(51, 50, 1), nrAllocationClass(51, 49, 2)]).toEqual(['edge', 'edge', 'edge']);
    expect(nrAllocationClass(51, 1, 1)).toBe('inner');
    expect(nrAllocationClass(51, 0, 3)).toBe('outer');
  });

  it('NR TS 38.101-1 Table 6.2.2-1: DFT-s-OFDM QPSK 3.5 / 1 / 0, CP-OFDM QPSK 3.5 / 3 / 1.5 for edge / outer / inner', () => {
    expect(nrAllocationClass(51, 10, 10)).toBe('inner');
    expect(nrAllocationClass(51, 0, 51)).toBe('outer');
    expect(nrAllocationClass(51, 0, 2)).toBe('edge');
    expect(nrMprAllowance(51, 10, 10, 'qpsk', 'dft-s-ofdm')!.maxMprDb).toBe(0);
    expect(nrMprAllowance(51, 0, 51, 'qpsk', 'dft-s-ofdm')!.maxMprDb).toBe(1);
    expect(nrMprAllowance(51, 0, 2, 'qpsk', 'dft-s-ofdm')!.maxMprDb).toBe(3.5);
    expect(nrMprAllowance(51, 10, 10, 'qpsk', 'ofdm')!.maxMprDb).toBe(1.5);
    expect(nrMprAllowance(51, 0, 51, 'qpsk', 'ofdm')!.maxMprDb).toBe(3);
    expect(nrMprAllowance(51, 10, 10, 'pi/2-bpsk', 'dft-s-ofdm')!.maxMprDb).toBe(0.2);
    expect(nrMprAllowance(51, 10, 10, '256qam', 'ofdm')!.maxMprDb).toBe(6.5);
    // The takeaway of REFERENCE.md §5.6: inner QPSK, DFT-s-OFDM is allowed 1.5 dB less MPR than CP-OFDM.
    expect(nrMprAllowance(51, 10, 10, 'qpsk', 'ofdm')!.maxMprDb - nrMprAllowance(51, 10, 10, 'qpsk', 'dft-s-ofdm')!.maxMprDb).toBe(1.5);
    expect(mprAllowanceFor(nrDl, 20, 0, 10, 'qpsk', 'ofdm')).toBeUndefined();
  });
});
