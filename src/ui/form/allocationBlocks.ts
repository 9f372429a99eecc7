/**
 * The allocation as the RB picker edits it: a list of blocks (start RB, number of RB, optional
 * modulation and power offset). One block is written back as a single object, several as a list,
 * exactly as the CLI's JSON takes them; "whole grid" leaves the field out (the schema's default).
 * Pure list arithmetic on the draft; the rules of the standards are checked by the engine.
 */
import type { ConfigDraft } from '../state/configValidation';

export interface BlockDraft {
  startRb: unknown;
  numRb: unknown;
  modulation?: unknown;
  powerOffsetDb?: unknown;
}

/** The draft's blocks (empty when the whole grid is used). */
export function readBlocks(draft: ConfigDraft): BlockDraft[] {
  const allocation = draft.allocation;
  if (allocation === undefined) return [];
  const list = Array.isArray(allocation) ? allocation : [allocation];
  return list.map((block) => (block !== null && typeof block === 'object' ? { ...(block as BlockDraft) } : { startRb: block, numRb: undefined }));
}

/** The value to store in `allocation` for `blocks`: undefined (whole grid), one object, or a list. */
export function allocationValue(blocks: readonly BlockDraft[]): unknown {
  if (blocks.length === 0) return undefined;
  const clean = blocks.map((block) => {
    const out: Record<string, unknown> = { startRb: block.startRb, numRb: block.numRb };
    if (block.modulation !== undefined) out.modulation = block.modulation;
    if (block.powerOffsetDb !== undefined) out.powerOffsetDb = block.powerOffsetDb;
    return out;
  });
  return clean.length === 1 ? clean[0] : clean;
}

/** The schema/engine path of field `key` of block `index` (a single block has no index in its path). */
export function blockFieldPath(numBlocks: number, index: number, key: keyof BlockDraft): string {
  return numBlocks === 1 ? `allocation.${key}` : `allocation.${index}.${key}`;
}

const isWhole = (value: unknown): value is number => typeof value === 'number' && Number.isInteger(value);

/** RB span [start, end) of a block whose numbers are whole, else undefined. */
export function blockSpan(block: BlockDraft): { startRb: number; endRb: number } | undefined {
  if (!isWhole(block.startRb) || !isWhole(block.numRb)) return undefined;
  return { startRb: block.startRb, endRb: block.startRb + block.numRb };
}

/**
 * A new block for the first free run of RBs after the existing ones (or before them), at most
 * `preferredNumRb` wide; undefined when the grid has no free RB.
 */
export function nextFreeBlock(blocks: readonly BlockDraft[], gridNumRb: number, preferredNumRb = 4): BlockDraft | undefined {
  const taken = new Uint8Array(gridNumRb);
  for (const block of blocks) {
    const span = blockSpan(block);
    if (span === undefined) continue;
    for (let rb = Math.max(0, span.startRb); rb < Math.min(gridNumRb, span.endRb); rb++) taken[rb] = 1;
  }
  let lastEnd = 0;
  for (const block of blocks) lastEnd = Math.max(lastEnd, blockSpan(block)?.endRb ?? 0);
  const searchFrom = [lastEnd, 0];
  for (const from of searchFrom) {
    let start = from;
    while (start < gridNumRb && taken[start] === 1) start++;
    if (start >= gridNumRb) continue;
    let end = start;
    while (end < gridNumRb && taken[end] === 0 && end - start < preferredNumRb) end++;
    return { startRb: start, numRb: end - start };
  }
  return undefined;
}

/** Which block (index) covers RB `rb`, or −1. */
export function blockAtRb(blocks: readonly BlockDraft[], rb: number): number {
  return blocks.findIndex((block) => {
    const span = blockSpan(block);
    return span !== undefined && rb >= span.startRb && rb < span.endRb;
  });
}

/** `blocks` with block `index` set to span RBs a…b (inclusive, either order), clamped to the grid. */
export function withBlockRange(blocks: readonly BlockDraft[], index: number, rbA: number, rbB: number, gridNumRb: number): BlockDraft[] {
  const low = Math.max(0, Math.min(rbA, rbB, gridNumRb - 1));
  const high = Math.min(gridNumRb - 1, Math.max(rbA, rbB, 0));
  return blocks.map((block, i) => (i === index ? { ...block, startRb: low, numRb: high - low + 1 } : block));
}
