import { describe, expect, it } from 'vitest';
import { findBoundaryViolations, listImports } from '../../scripts/checkBoundaries';

// The layer rules are the house rule in /work/shared/STYLE.md §1 (src/dsp imports only src/dsp, fft.js
// and `import type` from src/config); these cases pin the checker's reading of TypeScript import forms.

function violationsOf(path: string, text: string): string[] {
  return findBoundaryViolations([{ path, text }]).map((v) => `${v.line}:${v.specifier}`);
}

describe('listImports', () => {
  it('sees static, re-export, dynamic, require and import-type references', () => {
    const text = [
      'import a from "./a";',
      'import type { B } from "./b";',
      'import { type C, type D } from "./c";',
      'import { type E, F } from "./e";',
      'export * from "./g";',
      'export type { H } from "./h";',
      'const i = await import("./i");',
      'const j = require("./j");',
      'let k: import("./k").K;',
      'import "./side";',
    ].join('\n');
    const sites = listImports({ path: 'src/dsp/x.ts', text }).map((s) => `${s.specifier}:${s.typeOnly}`);
    expect(sites).toEqual([
      './a:false',
      './b:true',
      './c:true',
      './e:false',
      './g:false',
      './h:true',
      './i:false',
      './j:false',
      './k:true',
      './side:false',
    ]);
  });
});

describe('findBoundaryViolations for src/dsp', () => {
  it('allows src/dsp, fft.js and import type from src/config', () => {
    const text = [
      'import FFT from "fft.js";',
      'import { DspError } from "../errors.js";',
      'import { createFftPlan } from "./fft/plan";',
      'import type { WaveformConfig } from "../../config/schema.js";',
    ].join('\n');
    expect(violationsOf('src/dsp/waveform/generateWaveform.ts', text)).toEqual([]);
  });

  it('rejects a value import from src/config, other layers, packages and Node built-ins', () => {
    const text = [
      'import { parseWaveformConfig } from "../config/schema";',
      'import { useStore } from "../ui/state/store";',
      'import { z } from "zod";',
      'import { readFileSync } from "node:fs";',
      'import path from "path";',
      'const fftJsInternals = await import("fft.js/lib/fft.js");',
    ].join('\n');
    expect(violationsOf('src/dsp/ofdm.ts', text)).toEqual([
      '1:../config/schema',
      '2:../ui/state/store',
      '3:zod',
      '4:node:fs',
      '5:path',
    ]);
  });

  it('rejects a relative path that climbs out of src/dsp and back under a look-alike name', () => {
    expect(violationsOf('src/dsp/a.ts', 'import { x } from "../dspExtras/x";')).toEqual(['1:../dspExtras/x']);
  });

  it('names the layer, the specifier and the allowed areas in the message', () => {
    const [violation] = findBoundaryViolations([{ path: 'src/dsp/a.ts', text: 'import "../io/iqFormats";' }]);
    expect(violation?.message).toContain('src/dsp may import only from src/dsp');
    expect(violation?.message).toContain('src/io/iqFormats');
  });
});

describe('findBoundaryViolations for the other layers', () => {
  it('keeps DSP values off the UI thread but allows DspError and dsp types', () => {
    const text = [
      'import { DspError } from "../../dsp/errors";',
      'import type { GeneratedWaveform } from "../../dsp/waveform/generateWaveform";',
      'import { generateWaveform } from "../../dsp/waveform/generateWaveform";',
    ].join('\n');
    expect(violationsOf('src/ui/state/resultsSlice.ts', text)).toEqual(['3:../../dsp/waveform/generateWaveform']);
  });

  it('allows Node built-ins only in src/cli', () => {
    expect(violationsOf('src/cli/main.ts', 'import { rename } from "node:fs/promises";')).toEqual([]);
    expect(violationsOf('src/io/metadata.ts', 'import { createHash } from "node:crypto";')).toEqual(['1:node:crypto']);
  });

  it('does not check files outside the ruled layers', () => {
    expect(violationsOf('bench/run.ts', 'import { readFileSync } from "node:fs";')).toEqual([]);
  });
});
