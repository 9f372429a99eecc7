import { RE_REFERENCE } from '../waveform/resourceKinds';
import { fillLteCrsRow } from './lteCrs';
import { fillLteDmrsRow } from './lteDmrs';
import { fillNrGoldDmrsRow, fillNrLowPaprDmrsRow, nrDmrsInitialisation } from './nrDmrs';
import { isReferenceSymbol, slotPosition, type ReferenceSignalPlan } from './referenceSignalPlan';

/**
 * Writes the reference signals of OFDM symbol `symbolIndex` (counted from the first symbol of slot 0, which starts
 * frame 0) into its grid row and marks those elements RE_REFERENCE. Symbols without reference signals are untouched.
 * @param rowIq grid row a_{k',l}, 2·12·N_RB values
 * @param kinds the row's element kinds, 12·N_RB values
 * @returns the number of reference elements written
 */
export function fillReferenceSignals(plan: ReferenceSignalPlan, symbolIndex: number, rowIq: Float64Array, kinds: Uint8Array): number {
  if (plan.kind === 'none' || !isReferenceSymbol(plan, symbolIndex)) return 0;
  const { slotInFrame, symbolInSlot } = slotPosition(plan, symbolIndex);
  switch (plan.kind) {
    case 'lte-pusch-dmrs':
      fillLteDmrsRow(plan.blocks, rowIq, kinds);
      break;
    case 'lte-crs':
      fillLteCrsRow(plan.numRb, slotInFrame, symbolInSlot, plan.params.cellId, plan.extendedCp, rowIq, kinds);
      break;
    case 'nr-dmrs-low-papr':
      fillNrLowPaprDmrsRow(plan.blocks, rowIq, kinds);
      break;
    case 'nr-dmrs-gold':
      fillNrGoldDmrsRow(
        plan.blocks,
        nrDmrsInitialisation(plan.symbolsPerSlot, slotInFrame, symbolInSlot, plan.params.scramblingId, plan.params.nScid),
        rowIq,
        kinds,
      );
      break;
  }
  let count = 0;
  for (let k = 0; k < kinds.length; k++) if (kinds[k] === RE_REFERENCE) count++;
  return count;
}
