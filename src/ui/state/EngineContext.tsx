import { createContext, useContext } from 'react';
import type { EngineClient } from '../../worker/client';

/** The page's engine client, for components that ask the worker directly (the export dialog). */
export const EngineContext = createContext<EngineClient | null>(null);

export function useEngineClient(): EngineClient {
  const client = useContext(EngineContext);
  if (client === null) throw new Error('useEngineClient needs an <EngineContext.Provider> above it.');
  return client;
}
