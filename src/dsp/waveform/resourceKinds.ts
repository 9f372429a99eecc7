/**
 * Kind of each resource element in a grid's `gridKinds` (one byte per element), so the UI can draw what each holds
 * and the receiver knows where data and reference signals sit.
 */
export const RE_EMPTY = 0;
export const RE_DATA = 1;
export const RE_REFERENCE = 2;
