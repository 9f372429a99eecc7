import { createContext, useContext } from 'react';
import type { CcdfRunControls } from './ccdfRunController';

export const CcdfRunContext = createContext<CcdfRunControls | null>(null);

export function useCcdfRuns(): CcdfRunControls {
  const controls = useContext(CcdfRunContext);
  if (controls === null) throw new Error('useCcdfRuns needs a <CcdfRunContext.Provider> above it.');
  return controls;
}
