/**
 * Saving and restoring the workspace (pinned scenarios, baseline, the configuration being edited)
 * as whole snapshots in an append-only RecordStore:
 *
 * - a save appends a new snapshot; only after that write has committed are snapshots older than
 *   the newest KEEP_SNAPSHOTS removed, so a failed or interrupted save leaves the earlier ones intact;
 * - loading takes the newest snapshot that reads back as a valid workspace (a damaged one is skipped).
 */
import type { RecordStore } from './recordStore';

/** Snapshots kept after a successful save (older ones are removed). */
export const KEEP_SNAPSHOTS = 5;
export const WORKSPACE_FORMAT = 'crestline-workspace';
export const WORKSPACE_VERSION = 1;

export interface SavedScenario {
  id: string;
  name: string;
  description: string;
  /** Configuration input as the CLI takes it. */
  config: Record<string, unknown>;
  /** Milliseconds since 1970 when it was pinned. */
  pinnedAtMs: number;
}

export interface Workspace {
  scenarios: SavedScenario[];
  baselineId: string | null;
  current: { name: string; description: string; config: Record<string, unknown> };
}

export interface WorkspaceSnapshot extends Workspace {
  format: typeof WORKSPACE_FORMAT;
  version: typeof WORKSPACE_VERSION;
  savedAtMs: number;
}

export type SaveOutcome = { ok: true; key: number } | { ok: false; message: string };

const isObject = (value: unknown): value is Record<string, unknown> => value !== null && typeof value === 'object' && !Array.isArray(value);

function isSavedScenario(value: unknown): value is SavedScenario {
  return (
    isObject(value) &&
    typeof value.id === 'string' &&
    typeof value.name === 'string' &&
    typeof value.description === 'string' &&
    isObject(value.config) &&
    typeof value.pinnedAtMs === 'number'
  );
}

/** True when `value` is a snapshot this build can restore. */
export function isWorkspaceSnapshot(value: unknown): value is WorkspaceSnapshot {
  if (!isObject(value) || value.format !== WORKSPACE_FORMAT || value.version !== WORKSPACE_VERSION) return false;
  const current = value.current;
  return (
    Array.isArray(value.scenarios) &&
    value.scenarios.every(isSavedScenario) &&
    (value.baselineId === null || typeof value.baselineId === 'string') &&
    isObject(current) &&
    typeof current.name === 'string' &&
    typeof current.description === 'string' &&
    isObject(current.config)
  );
}

export interface WorkspaceArchive {
  /** The newest valid snapshot, or null when nothing was saved yet. */
  load(): Promise<WorkspaceSnapshot | null>;
  /** Appends a snapshot of `workspace`, then prunes old ones; never rejects (the outcome says what happened). */
  save(workspace: Workspace, nowMs: number): Promise<SaveOutcome>;
}

export function createWorkspaceArchive(store: RecordStore<unknown>): WorkspaceArchive {
  // Saves run one after another, so pruning never races a newer append.
  let chain: Promise<unknown> = Promise.resolve();

  const saveNow = async (workspace: Workspace, nowMs: number): Promise<SaveOutcome> => {
    const snapshot: WorkspaceSnapshot = { format: WORKSPACE_FORMAT, version: WORKSPACE_VERSION, savedAtMs: nowMs, ...structuredClone(workspace) };
    let key: number;
    try {
      key = await store.append(snapshot);
    } catch (error) {
      return { ok: false, message: error instanceof Error ? error.message : String(error) };
    }
    try {
      const records = await store.readAll();
      const older = records.filter((record) => record.key < key).map((record) => record.key);
      const surplus = older.slice(0, Math.max(0, older.length - (KEEP_SNAPSHOTS - 1)));
      if (surplus.length > 0) await store.remove(surplus);
    } catch {
      // Pruning is housekeeping: the new snapshot is safe; old ones stay until the next save.
    }
    return { ok: true, key };
  };

  return {
    load: async () => {
      const records = await store.readAll();
      for (let i = records.length - 1; i >= 0; i--) {
        const value = records[i]!.value;
        if (isWorkspaceSnapshot(value)) return value;
      }
      return null;
    },
    save: (workspace, nowMs) => {
      const outcome = chain.then(() => saveNow(workspace, nowMs));
      chain = outcome;
      return outcome;
    },
  };
}
