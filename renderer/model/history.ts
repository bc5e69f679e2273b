/**
 * Undo history as deltas of the design document only (never of solver output, which is
 * always recomputed). A delta is a list of value changes at paths; undo writes each
 * `before` back in reverse order, redo writes each `after`.
 */
import { getAt, setAt, cloneJson, jsonEqual, type DesignPath } from './designPath';

export interface Change {
  path: DesignPath;
  /** Value before the edit; undefined when the key did not exist. */
  before: unknown;
  /** Value after the edit; undefined when the edit removed the key. */
  after: unknown;
}

export interface Delta {
  /** Words for the menu: "Undo edit x of the right upper outer joint". */
  label: string;
  changes: Change[];
}

export function applyDelta<T>(doc: T, delta: Delta, direction: 'undo' | 'redo'): T {
  let out = doc;
  if (direction === 'redo') for (const c of delta.changes) out = setAt(out, c.path, cloneJson(c.after));
  else for (let i = delta.changes.length - 1; i >= 0; i--) out = setAt(out, delta.changes[i].path, cloneJson(delta.changes[i].before));
  return out;
}

/** The change at one path between two documents, or null when the value is the same. */
export function changeAt(before: unknown, after: unknown, path: DesignPath): Change | null {
  const b = getAt(before, path);
  const a = getAt(after, path);
  if (jsonEqual(a, b)) return null;
  return { path, before: cloneJson(b), after: cloneJson(a) };
}

const isPlainObject = (v: unknown): v is Record<string, unknown> => typeof v === 'object' && v !== null && !Array.isArray(v);

/**
 * The paths at which two documents differ, as deep as both sides are objects (a moved point
 * is one path, not the whole design), so a whole-design edit (an applied tune or proposal, an
 * imported table) is recorded as the few values it changed.
 */
export function differingPaths(before: unknown, after: unknown, path: DesignPath = []): DesignPath[] {
  if (jsonEqual(before, after)) return [];
  // Objects of other keys (a mirrored point that became two sides) change as a whole, so undo
  // gives back the object as it was, keys in their order.
  if (!isPlainObject(before) || !isPlainObject(after) || !sameKeys(before, after)) return [path];
  return Object.keys(before).flatMap((k) => differingPaths(before[k], after[k], [...path, k]));
}

function sameKeys(a: Record<string, unknown>, b: Record<string, unknown>): boolean {
  const ka = Object.keys(a);
  const kb = Object.keys(b);
  return ka.length === kb.length && ka.every((k, i) => k === kb[i]);
}

/** Most undo steps kept; the oldest are dropped beyond it. */
export const HISTORY_LIMIT = 500;

export interface HistoryState {
  past: Delta[];
  future: Delta[];
}

export function pushDelta(h: HistoryState, delta: Delta): HistoryState {
  const past = h.past.length >= HISTORY_LIMIT ? h.past.slice(h.past.length - HISTORY_LIMIT + 1) : h.past.slice();
  past.push(delta);
  return { past, future: [] };
}
