import { parentPort } from 'node:worker_threads';
import type { BlockMeasurer } from '../../dsp/montecarlo/blockMeasurer';
import { createSetupMeasurer } from '../../dsp/montecarlo/measurementSetup';
import { DspError } from '../../dsp/errors';
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
  try {
    switch (message.type) {
      case 'init':
        measurer = createSetupMeasurer(message.setup).measurer;
        post({ type: 'ready' });
        return;
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
  } catch (err) {
    const code = err instanceof DspError ? err.code : 'INTERNAL';
    post({ type: 'error', code, message: (err as Error).message ?? String(err) });
  }
});
