/**
 * Undo and redo for Tune: a list of past states, the present and the undone future.
 * A plain value (no React), so the screen keeps it in a reducer or a state hook.
 *
 * - `commit(h, next)`: an edit; the present goes to the past, the future is dropped.
 * - `replace(h, next)`: the same edit continuing (the frames of one drag after its first
 *   commit), so a whole drag is one step to undo.
 * - Equal states are not recorded twice (a drag that ends where it began adds nothing).
 */
export interface History<T> {
  past: T[];
  present: T;
  future: T[];
}

/** How many edits are kept to undo. */
export const HISTORY_LIMIT = 200;

export const startHistory = <T,>(present: T): History<T> => ({ past: [], present, future: [] });

export function commit<T>(h: History<T>, next: T, same: (a: T, b: T) => boolean = Object.is): History<T> {
  if (same(h.present, next)) return h;
  const past = [...h.past, h.present];
  return { past: past.length > HISTORY_LIMIT ? past.slice(past.length - HISTORY_LIMIT) : past, present: next, future: [] };
}

export function replace<T>(h: History<T>, next: T): History<T> {
  return { ...h, present: next };
}

export const canUndo = <T,>(h: History<T>) => h.past.length > 0;
export const canRedo = <T,>(h: History<T>) => h.future.length > 0;

export function undo<T>(h: History<T>): History<T> {
  if (!canUndo(h)) return h;
  return { past: h.past.slice(0, -1), present: h.past[h.past.length - 1], future: [h.present, ...h.future] };
}

export function redo<T>(h: History<T>): History<T> {
  if (!canRedo(h)) return h;
  return { past: [...h.past, h.present], present: h.future[0], future: h.future.slice(1) };
}

/** Drop a drag's last step when it ended where it began (commit at the start, replaces after). */
export function settle<T>(h: History<T>, same: (a: T, b: T) => boolean): History<T> {
  const before = h.past[h.past.length - 1];
  return before !== undefined && same(before, h.present) ? { ...h, past: h.past.slice(0, -1) } : h;
}

/** The key press that undoes or redoes: Ctrl/⌘+Z, Ctrl/⌘+Shift+Z (and Ctrl+Y). */
export function historyKey(e: { key: string; ctrlKey: boolean; metaKey: boolean; shiftKey: boolean; altKey: boolean }): 'undo' | 'redo' | null {
  if (!(e.ctrlKey || e.metaKey) || e.altKey) return null;
  const k = e.key.toLowerCase();
  if (k === 'z') return e.shiftKey ? 'redo' : 'undo';
  if (k === 'y' && !e.shiftKey) return 'redo';
  return null;
}
