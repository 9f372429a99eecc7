import { createContext, useContext } from 'react';
import type { UpdateTimer } from './updateTimer';

/** The page's update timer; null (no timing) in tests that render without it. */
export const UpdateTimerContext = createContext<UpdateTimer | null>(null);

export function useUpdateTimer(): UpdateTimer | null {
  return useContext(UpdateTimerContext);
}
