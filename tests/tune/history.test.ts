import { describe, expect, it } from 'vitest';
import { HISTORY_LIMIT, canRedo, canUndo, commit, historyKey, redo, replace, settle, startHistory, undo } from '@/components/tune/history';

describe('Tune undo/redo history', () => {
  it('undoes and redoes edits in order; a new edit drops the redo list', () => {
    let h = startHistory(1);
    h = commit(h, 2);
    h = commit(h, 3);
    expect(canUndo(h)).toBe(true);
    h = undo(h);
    expect(h.present).toBe(2);
    h = undo(h);
    expect(h.present).toBe(1);
    expect(canUndo(h)).toBe(false);
    expect(undo(h)).toBe(h);
    h = redo(h);
    expect(h.present).toBe(2);
    h = commit(h, 9);
    expect(canRedo(h)).toBe(false);
    expect(h.past).toEqual([1, 2]);
  });

  it('records a whole drag as one step (commit at the start, replace per frame)', () => {
    let h = startHistory('a');
    h = commit(h, 'a1');
    h = replace(h, 'a2');
    h = replace(h, 'a3');
    expect(h.past).toEqual(['a']);
    expect(undo(h).present).toBe('a');
  });

  it('adds nothing for an edit that changes nothing, or a drag that ends where it began', () => {
    const same = (x: { v: number }, y: { v: number }) => x.v === y.v;
    let h = startHistory({ v: 1 });
    h = commit(h, { v: 1 }, same);
    expect(h.past).toHaveLength(0);
    h = commit(h, { v: 2 }, same);
    h = replace(h, { v: 1 });
    h = settle(h, same);
    expect(h.past).toHaveLength(0);
  });

  it('keeps at most HISTORY_LIMIT steps', () => {
    let h = startHistory(0);
    for (let i = 1; i <= HISTORY_LIMIT + 20; i++) h = commit(h, i);
    expect(h.past).toHaveLength(HISTORY_LIMIT);
    expect(h.past[0]).toBe(20);
  });

  it('reads Ctrl+Z as undo and Ctrl+Shift+Z / Ctrl+Y as redo (⌘ on a Mac)', () => {
    const k = (key: string, mods: Partial<{ ctrlKey: boolean; metaKey: boolean; shiftKey: boolean; altKey: boolean }>) =>
      historyKey({ key, ctrlKey: false, metaKey: false, shiftKey: false, altKey: false, ...mods });
    expect(k('z', { ctrlKey: true })).toBe('undo');
    expect(k('Z', { ctrlKey: true, shiftKey: true })).toBe('redo');
    expect(k('z', { metaKey: true })).toBe('undo');
    expect(k('y', { ctrlKey: true })).toBe('redo');
    expect(k('z', {})).toBeNull();
    expect(k('z', { ctrlKey: true, altKey: true })).toBeNull();
  });
});
