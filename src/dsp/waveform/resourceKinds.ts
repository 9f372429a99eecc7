/**
 * Kind of each resource element in a grid's `gridKinds` (one byte per element), so the UI can draw what each holds
 * and the receiver knows where data and reference signals sit.
 */
/** Element nothing is written to (a grid subcarrier outside every allocation). */
export const RE_EMPTY = 0;
/** Carries a data (constellation) symbol. */
export const RE_DATA = 1;
/** Carries a reference signal (DMRS or CRS, see reference/referenceSignalPlan.ts). */
export const RE_REFERENCE = 2;
