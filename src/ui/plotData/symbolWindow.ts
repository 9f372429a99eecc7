/**
 * Where one OFDM symbol sits in the generated data: its samples (cyclic prefix first) and its
 * data symbols. Pure index arithmetic over what the engine returned; no signal processing.
 */
import { GRID_KIND, type EngineWaveform } from '../../worker/protocol';

export interface SymbolSampleWindow {
  symbolIndex: number;
  /** First sample of the cyclic prefix, in the whole waveform (output rate). */
  startSample: number;
  cpLengthSamples: number;
  /** First sample of the useful part (= startSample + cpLengthSamples). */
  usefulStartSample: number;
  /** One past the last sample of the symbol. */
  endSample: number;
}

/** Samples of symbol `symbolIndex` as laid out by the engine (lengths already include oversampling). */
export function locateSymbolSamples(waveform: Pick<EngineWaveform, 'symbolLayout'>, symbolIndex: number): SymbolSampleWindow {
  const layout = waveform.symbolLayout[symbolIndex];
  if (layout === undefined) {
    throw new RangeError(`Symbol ${symbolIndex} is not in the waveform (it has ${waveform.symbolLayout.length} symbols).`);
  }
  const usefulStartSample = layout.startSample + layout.cpLengthSamples;
  return {
    symbolIndex,
    startSample: layout.startSample,
    cpLengthSamples: layout.cpLengthSamples,
    usefulStartSample,
    endSample: usefulStartSample + layout.fftSize,
  };
}

export interface DataSymbolRange {
  /** Index of the first data symbol of this OFDM symbol in `dataSymbolsIq` (complex values, not array slots). */
  first: number;
  count: number;
}

/**
 * Data symbols of OFDM symbol `symbolIndex` in `dataSymbolsIq`. The engine fills data symbols in
 * the order of the data resource elements, symbol by symbol (CORE_API), so the data symbols of
 * symbol l follow those of symbols 0…l−1; counting data REs also holds for symbols with references.
 */
export function locateDataSymbols(
  waveform: Pick<EngineWaveform, 'gridKinds' | 'numGridSubcarriers' | 'numSymbols'>,
  symbolIndex: number,
): DataSymbolRange {
  if (!Number.isInteger(symbolIndex) || symbolIndex < 0 || symbolIndex >= waveform.numSymbols) {
    throw new RangeError(`Symbol ${symbolIndex} is not in the grid (it has ${waveform.numSymbols} symbols).`);
  }
  const k = waveform.numGridSubcarriers;
  let first = 0;
  let count = 0;
  for (let l = 0; l <= symbolIndex; l++) {
    let inRow = 0;
    for (let i = l * k; i < (l + 1) * k; i++) if (waveform.gridKinds[i] === GRID_KIND.data) inRow += 1;
    if (l < symbolIndex) first += inRow;
    else count = inRow;
  }
  return { first, count };
}
