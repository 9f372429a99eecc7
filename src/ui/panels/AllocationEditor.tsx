import { useId, useRef, useState, type PointerEvent as ReactPointerEvent } from 'react';
import { waveformConfigSchema } from '../../config/schema';
import {
  allocationValue,
  blockAtRb,
  blockFieldPath,
  blockSpan,
  nextFreeBlock,
  readBlocks,
  withBlockRange,
  type BlockDraft,
} from '../form/allocationBlocks';
import { gridNumRb } from '../form/gridSize';
import { useAppStore } from '../state/AppStoreContext';
import { fieldMessage } from '../state/configValidation';
import { displayName, parseNumberInput } from './configFields';

const modulations = waveformConfigSchema.shape.modulation.unwrap().options;
/** Colours of the blocks in the RB strip (ours; CSS variables --block-0 … --block-5 follow the colour scheme). */
const NUM_BLOCK_COLOURS = 6;

interface DragState {
  blockIndex: number;
  anchorRb: number;
  moved: boolean;
}

/**
 * The allocation: "whole grid", or blocks of RBs, each with its own modulation and power offset.
 * The strip above the table draws the grid; drag across it to set the selected block's RBs, click a
 * free RB to move the block there. Every number is also a labelled input (keyboard users need no strip).
 */
export function AllocationEditor() {
  const draft = useAppStore((state) => state.draft);
  const fieldErrors = useAppStore((state) => state.fieldErrors);
  const setField = useAppStore((state) => state.setField);
  const resultNumRb = useAppStore((state) => state.result?.waveform.summary.numerology.numRb);
  const [selected, setSelected] = useState(0);
  const drag = useRef<DragState | null>(null);
  const stripRef = useRef<SVGSVGElement>(null);
  const baseId = useId();

  const blocks = readBlocks(draft);
  const numRb = gridNumRb(draft) ?? resultNumRb ?? 0;
  const wholeGrid = blocks.length === 0;
  const defaultModulation = typeof draft.modulation === 'string' ? draft.modulation : 'qpsk';
  const selectedIndex = Math.min(selected, Math.max(0, blocks.length - 1));
  const commit = (next: BlockDraft[]) => setField('allocation', allocationValue(next));

  const rbAt = (event: ReactPointerEvent): number => {
    const rect = stripRef.current?.getBoundingClientRect();
    if (rect === undefined || rect.width === 0) return 0;
    return Math.min(numRb - 1, Math.max(0, Math.floor(((event.clientX - rect.left) / rect.width) * numRb)));
  };

  const onPointerDown = (event: ReactPointerEvent<SVGSVGElement>) => {
    if (numRb === 0) return;
    const rb = rbAt(event);
    let list = blocks;
    if (wholeGrid) {
      list = [{ startRb: rb, numRb: 1 }];
      commit(list);
    }
    const hit = blockAtRb(list, rb);
    const blockIndex = hit >= 0 ? hit : wholeGrid ? 0 : selectedIndex;
    setSelected(blockIndex);
    drag.current = { blockIndex, anchorRb: rb, moved: false };
    event.currentTarget.setPointerCapture(event.pointerId);
  };

  const onPointerMove = (event: ReactPointerEvent<SVGSVGElement>) => {
    const state = drag.current;
    if (state === null) return;
    const rb = rbAt(event);
    if (rb === state.anchorRb && !state.moved) return;
    state.moved = true;
    commit(withBlockRange(blocks, state.blockIndex, state.anchorRb, rb, numRb));
  };

  const onPointerUp = (event: ReactPointerEvent<SVGSVGElement>) => {
    const state = drag.current;
    drag.current = null;
    if (state === null || state.moved) return;
    const rb = rbAt(event);
    const current = blocks;
    const block = current[state.blockIndex];
    // A click on a free RB moves the selected block there, keeping its size.
    if (block !== undefined && blockAtRb(current, rb) < 0 && typeof block.numRb === 'number') {
      const start = Math.min(rb, Math.max(0, numRb - block.numRb));
      commit(current.map((b, i) => (i === state.blockIndex ? { ...b, startRb: start } : b)));
    }
  };

  const setBlockField = (index: number, key: keyof BlockDraft, value: unknown) =>
    commit(blocks.map((block, i) => (i === index ? { ...block, [key]: value } : block)));

  const addBlock = () => {
    const added = nextFreeBlock(blocks, numRb);
    if (added === undefined) return;
    setSelected(blocks.length);
    commit([...blocks, added]);
  };

  const blockPaths = blocks.flatMap((_, i) => (['startRb', 'numRb', 'modulation', 'powerOffsetDb'] as const).map((key) => blockFieldPath(blocks.length, i, key)));
  const generalIssues = Object.entries(fieldErrors)
    .filter(([path]) => (path === 'allocation' || path.startsWith('allocation.')) && !blockPaths.some((p) => path === p || path.startsWith(`${p}.`)))
    .map(([, message]) => message);
  const usedRb = blocks.reduce((sum, block) => sum + (typeof block.numRb === 'number' ? block.numRb : 0), 0);

  return (
    <div className="allocation-editor" data-field="allocation">
      <div className="allocation-head">
        <label className="checkbox">
          <input
            type="checkbox"
            checked={wholeGrid}
            onChange={(event) => commit(event.target.checked ? [] : [{ startRb: 0, numRb: Math.max(1, numRb) }])}
          />
          Whole grid
        </label>
        <span className="unit" aria-live="polite">
          {numRb > 0 ? `${wholeGrid ? numRb : usedRb} of ${numRb} RB` : 'grid size unknown'}
        </span>
      </div>
      <svg
        ref={stripRef}
        className="rb-strip"
        viewBox={`0 0 ${Math.max(1, numRb)} 1`}
        preserveAspectRatio="none"
        role="img"
        aria-label={`Resource blocks 0 to ${Math.max(0, numRb - 1)}; allocated blocks coloured`}
        onPointerDown={onPointerDown}
        onPointerMove={onPointerMove}
        onPointerUp={onPointerUp}
      >
        <rect x={0} y={0} width={Math.max(1, numRb)} height={1} className="rb-free" />
        {(wholeGrid ? [{ startRb: 0, numRb }] : blocks).map((block, i) => {
          const span = blockSpan(block);
          if (span === undefined) return null;
          return (
            <rect
              key={i}
              x={span.startRb}
              y={0}
              width={Math.max(0, Math.min(numRb, span.endRb) - span.startRb)}
              height={1}
              className={`rb-block rb-block-${i % NUM_BLOCK_COLOURS}${!wholeGrid && i === selectedIndex ? ' rb-selected' : ''}`}
            />
          );
        })}
      </svg>
      <div className="rb-scale" aria-hidden="true">
        <span>RB 0</span>
        <span>{numRb > 0 ? `RB ${numRb - 1}` : ''}</span>
      </div>
      {!wholeGrid && (
        <table className="block-table">
          <thead>
            <tr>
              <th scope="col">#</th>
              <th scope="col">Start RB</th>
              <th scope="col">RBs</th>
              <th scope="col">Modulation</th>
              <th scope="col">Power (dB)</th>
              <th scope="col">
                <span className="visually-hidden">Remove</span>
              </th>
            </tr>
          </thead>
          <tbody>
            {blocks.map((block, i) => {
              const cellError = (key: keyof BlockDraft) => fieldMessage(fieldErrors, blockFieldPath(blocks.length, i, key));
              const rowErrors = (['startRb', 'numRb', 'modulation', 'powerOffsetDb'] as const)
                .map((key) => cellError(key))
                .filter((m): m is string => m !== undefined);
              const id = (key: string) => `${baseId}-${i}-${key}`;
              const numberCell = (key: 'startRb' | 'numRb' | 'powerOffsetDb', label: string) => (
                <td>
                  <input
                    id={id(key)}
                    type="number"
                    step={key === 'powerOffsetDb' ? 0.5 : 1}
                    aria-label={`Block ${i + 1} ${label}`}
                    aria-invalid={cellError(key) !== undefined}
                    {...(rowErrors.length > 0 ? { 'aria-describedby': id('error') } : {})}
                    value={block[key] === undefined ? (key === 'powerOffsetDb' ? '0' : '') : String(block[key])}
                    onFocus={() => setSelected(i)}
                    onChange={(event) => {
                      const parsed = parseNumberInput(event.target.value);
                      setBlockField(i, key, key === 'powerOffsetDb' && (parsed === '' || parsed === 0) ? undefined : parsed);
                    }}
                  />
                </td>
              );
              return [
                <tr key={`row-${i}`} className={i === selectedIndex ? 'block-selected' : undefined} data-block={i}>
                  <th scope="row">
                    <span className={`block-swatch rb-block-${i % NUM_BLOCK_COLOURS}`} aria-hidden="true" />
                    {i + 1}
                  </th>
                  {numberCell('startRb', 'start RB')}
                  {numberCell('numRb', 'number of RBs')}
                  <td>
                    <select
                      aria-label={`Block ${i + 1} modulation`}
                      aria-invalid={cellError('modulation') !== undefined}
                      value={typeof block.modulation === 'string' ? block.modulation : ''}
                      onFocus={() => setSelected(i)}
                      onChange={(event) => setBlockField(i, 'modulation', event.target.value === '' ? undefined : event.target.value)}
                    >
                      <option value="">as set ({displayName(defaultModulation)})</option>
                      {modulations.map((m) => (
                        <option key={m} value={m}>
                          {displayName(m)}
                        </option>
                      ))}
                    </select>
                  </td>
                  {numberCell('powerOffsetDb', 'power offset in dB')}
                  <td>
                    <button
                      type="button"
                      className="icon-button"
                      aria-label={`Remove block ${i + 1}`}
                      disabled={blocks.length <= 1}
                      onClick={() => {
                        setSelected(Math.max(0, i - 1));
                        commit(blocks.filter((_, j) => j !== i));
                      }}
                    >
                      ×
                    </button>
                  </td>
                </tr>,
                rowErrors.length > 0 ? (
                  <tr key={`error-${i}`} className="block-error-row">
                    <td colSpan={6}>
                      <p id={id('error')} className="field-error" role="alert">
                        {rowErrors.join('; ')}
                      </p>
                    </td>
                  </tr>
                ) : null,
              ];
            })}
          </tbody>
        </table>
      )}
      {!wholeGrid && (
        <button type="button" className="small-button" onClick={addBlock} disabled={nextFreeBlock(blocks, numRb) === undefined}>
          Add block
        </button>
      )}
      {generalIssues.length > 0 && (
        <p className="field-error" role="alert">
          {generalIssues.join('; ')}
        </p>
      )}
    </div>
  );
}
