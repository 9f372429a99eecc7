/**
 * Types for @echogarden/pffft-wasm 0.4.2 (ships none): each entry's default export is an Emscripten module factory.
 * `/simd` is the WebAssembly SIMD build; the bare entry is the scalar build. See src/dsp/fft/f32Fft.ts.
 */
declare module '@echogarden/pffft-wasm/simd' {
  const createPffftModule: (overrides?: Record<string, unknown>) => Promise<unknown>;
  export default createPffftModule;
}

declare module '@echogarden/pffft-wasm' {
  const createPffftModule: (overrides?: Record<string, unknown>) => Promise<unknown>;
  export default createPffftModule;
}
