/**
 * Reading and writing the form's draft at a dotted path ("data.seed", "allocation.1.numRb"), immutably.
 * The draft is WaveformConfigInput-shaped JSON; these helpers never validate (the schema does).
 */
import type { ConfigDraft } from '../state/configValidation';

type Json = unknown;

function parsePath(path: string): (string | number)[] {
  return path.split('.').map((part) => (/^\d+$/.test(part) ? Number(part) : part));
}

/** The value at `path`, or undefined when any step is missing. */
export function readAtPath(draft: ConfigDraft, path: string): Json {
  let node: Json = draft;
  for (const step of parsePath(path)) {
    if (node === null || typeof node !== 'object') return undefined;
    node = (node as Record<string | number, Json>)[step];
  }
  return node;
}

function writeInto(node: Json, steps: readonly (string | number)[], value: Json): Json {
  const [step, ...rest] = steps;
  if (step === undefined) return value;
  if (typeof step === 'number') {
    const list = Array.isArray(node) ? [...(node as Json[])] : [];
    if (rest.length === 0 && value === undefined) list.splice(step, 1);
    else list[step] = writeInto(list[step], rest, value);
    return list;
  }
  const object: Record<string, Json> = node !== null && typeof node === 'object' && !Array.isArray(node) ? { ...(node as Record<string, Json>) } : {};
  if (rest.length === 0 && value === undefined) delete object[step];
  else object[step] = writeInto(object[step], rest, value);
  return object;
}

/**
 * A copy of `draft` with `value` at `path` (objects and lists on the way are copied, not mutated);
 * `undefined` removes the key (or list entry) so the schema's default applies.
 */
export function writeAtPath(draft: ConfigDraft, path: string, value: Json): ConfigDraft {
  return writeInto(draft, parsePath(path), value) as ConfigDraft;
}
