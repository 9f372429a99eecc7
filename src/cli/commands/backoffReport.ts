import type { BackoffAnalysis } from '../../dsp/backoff/backoffAnalysis';

/** JSON-safe number: Infinity and NaN become null; others rounded to 4 decimals. */
function num(x: number | null | undefined): number | null {
  if (x === null || x === undefined || !Number.isFinite(x)) return null;
  return Math.round(x * 1e4) / 1e4;
}

/** The `--json` object of one analysis. */
export function backoffJson(a: BackoffAnalysis, description: string): Record<string, unknown> {
  const s = a.solution;
  return {
    configuration: description,
    amplifier: a.amplifier,
    axis: a.axis,
    oversampling: a.oversampling,
    limits: {
      evmPercent: a.limits.evm ? { value: a.limits.evm.value, source: a.limits.evm.source } : null,
      aclrDb: Object.fromEntries(Object.entries(a.limits.aclr).map(([k, v]) => [k, { value: v.value, source: v.source }])),
    },
    curve: a.curve.map((p) => ({
      backoffDb: num(p.backoffDb),
      oboDb: num(p.oboDb),
      iboDb: num(p.iboDb),
      evmRmsPercent: num(p.evmRmsPercent),
      evmStandardErrorPercent: num(p.evmStandardErrorPercent),
      aclrDb: Object.fromEntries(Object.entries(p.aclrDb).map(([k, v]) => [k, num(v)])),
      aclrStandardErrorDb: Object.fromEntries(Object.entries(p.aclrStandardErrorDb ?? {}).map(([k, v]) => [k, num(v)])),
      meanOutputDbm: a.psatDbm === null ? null : num(a.psatDbm - p.oboDb),
      meanOutputDbRelSat: num(p.meanOutputDbRelSat),
      paprAfterDb: num(p.paprAfterDb),
      powerCcdfDb: { '1e-3': num(p.powerCcdfDb['1e-3']), '1e-4': num(p.powerCcdfDb['1e-4']) },
    })),
    status: s.status,
    requiredOboDb: num(a.requiredOboDb),
    requiredIboDb: num(a.requiredIboDb),
    uncertaintyDb: num(s.uncertaintyDb),
    bracketDb: s.bracketDb ? [num(s.bracketDb[0]), num(s.bracketDb[1])] : null,
    limitingMetric: s.limitingMetric,
    limitingChannel: s.limitingChannel,
    psatDbm: num(a.psatDbm),
    usableOutputDbm: num(a.usableOutputDbm),
    mpr: a.mpr,
    methods: a.methods,
    message: s.message,
    warnings: a.warnings,
  };
}

/** The human-readable report of one analysis. */
export function backoffText(a: BackoffAnalysis, description: string): string[] {
  const lines = [`${description}`, `amplifier: ${a.amplifier}; sweep on ${a.axis.toUpperCase()}, oversampling ${a.oversampling}`];
  const channels = Object.keys(a.curve[0]?.aclrDb ?? {});
  lines.push(['  OBO dB', ' IBO dB', ' EVM %', ...channels.map((c) => c.padStart(11)), a.psatDbm !== null ? ' Pout dBm' : ' Pout dBsat'].join(' '));
  for (const p of a.curve) {
    const pout = a.psatDbm !== null ? a.psatDbm - p.oboDb : -p.oboDb;
    lines.push(
      [p.oboDb.toFixed(2).padStart(8), p.iboDb.toFixed(2).padStart(7), p.evmRmsPercent.toFixed(2).padStart(6), ...channels.map((c) => (p.aclrDb[c] ?? NaN).toFixed(1).padStart(11)), pout.toFixed(2).padStart(9)].join(' '),
    );
  }
  const evm = a.limits.evm ? `EVM ≤ ${a.limits.evm.value} % (${a.limits.evm.source})` : 'no EVM limit';
  const aclr = Object.entries(a.limits.aclr).map(([k, v]) => `${k} ≥ ${v.value} dB`).join(', ');
  lines.push(`limits: ${evm}; ACLR ${aclr || 'none'}`);
  lines.push(a.solution.message);
  if (a.requiredOboDb !== null) {
    lines.push(
      `required OBO ${a.requiredOboDb.toFixed(2)} dB ± ${(a.solution.uncertaintyDb ?? 0).toFixed(2)} dB (IBO ${a.requiredIboDb!.toFixed(2)} dB)` +
        (a.usableOutputDbm !== null ? `; usable mean output ${a.usableOutputDbm.toFixed(2)} dBm from P_sat ${a.psatDbm!.toFixed(2)} dBm` : ''),
    );
  }
  if (a.mpr) lines.push(`context: the standard allows MPR ≤ ${a.mpr.maxMprDb} dB for ${a.mpr.condition} (${a.mpr.source})`);
  for (const w of a.warnings) lines.push(`warning: ${w}`);
  return lines;
}
