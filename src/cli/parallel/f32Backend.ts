import { loadF32Fft } from '../../dsp/fft/f32Fft';

/**
 * Loads the f32 FFT backend (PFFFT WebAssembly: SIMD build, else scalar) into the calling thread, as every thread
 * that runs `--precision f32` statistics must (src/dsp never imports the package; see DEVELOPERS.md, Performance).
 * @returns the backend's name, or null with the reasons when none loaded
 */
export function loadCliF32Backend(): Promise<{ backend: string | null; failures: string[] }> {
  return loadF32Fft([() => import('@echogarden/pffft-wasm/simd'), () => import('@echogarden/pffft-wasm')]);
}
