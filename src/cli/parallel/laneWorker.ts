import { parentPort } from 'node:worker_threads';
import type { BlockMeasurer } from '../../dsp/montecarlo/blockMeasurer';
import { createSetupMeasurer } from '../../dsp/montecarlo/measurementSetup';
import { DspError } from '../../dsp/errors';
import { loadCliF32Backend } from './f32Backend';
import type { FromLaneWorker, ToLaneWorker } from './laneProtocol';

/**
 * Entry point of one Monte-Carlo worker thread: builds the same plan and power source as every other lane from the
 * setup it is sent, measures the blocks it is handed, and returns its histograms when asked. No DSP of its own.
 */
const port = parentPort;
if (!port) throw new Error('laneWorker.ts must run in a worker thread.');
let measurer: BlockMeasurer | undefined;

const post = (message: FromLaneWorker, transfer: ArrayBuffer[] = []): void => port.postMessage(message, transfer);

port.on('message', (message: ToLaneWorker) => {
  handle(message).catch((err: unknown) => {
    const code = err instanceof DspError ? err.code : 'INTERNAL';
    post({ type: 'error', code, message: (err as Error).message ?? String(err) });
  });
});

async function handle(message: ToLaneWorker): Promise<void> {
  switch (message.type) {
    case 'init': {
      // Each thread has its own WebAssembly instance; f32 statistics need it loaded here too.
      const f32Backend = message.setup.precision === 'f32' ? (await loadCliF32Backend()).backend : null;
      measurer = createSetupMeasurer(message.setup).measurer;
      post({ type: 'ready', f32Backend });
      return;
    }
    case 'block':
      if (!measurer) throw new DspError('INTERNAL', 'A worker was sent a block before its setup.');
      post({ type: 'record', record: measurer.measureBlock(message.blockIndex) });
      return;
    case 'take': {
      if (!measurer) throw new DspError('INTERNAL', 'A worker was asked for histograms before its setup.');
      const { paprRunMean, paprSymbolMean, power } = measurer.histograms;
      post({ type: 'histograms', paprRunMean, paprSymbolMean, power }, [
        paprRunMean.counts.buffer as ArrayBuffer,
        paprSymbolMean.counts.buffer as ArrayBuffer,
        power.counts.buffer as ArrayBuffer,
      ]);
      measurer = undefined;
      return;
    }
  }
}
