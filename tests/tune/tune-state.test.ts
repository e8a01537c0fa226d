import { describe, expect, it } from 'vitest';
import { SAMPLE_DESIGNS } from '@/lib/engine/samples';
import { COMPENSATOR_TYPES } from '@/lib/engine/types';
import { analyzeCompensator, prepareStage } from '@/components/tune/tune-analysis';
import {
  HISTORY_LIMIT,
  canRedo,
  canUndo,
  changeAmplifier,
  compareJson,
  historyKey,
  initTuneState,
  isDirty,
  placeType,
  tuneReducer,
  type TuneAction,
  type TuneState,
} from '@/components/tune/tune-state';

const buck = SAMPLE_DESIGNS.find((d) => d.key === 'buck-24v-5v')!.request;
const start = () => initTuneState({ initialInput: buck, shownRevision: 1 });
const run = (s: TuneState, ...actions: TuneAction[]) => actions.reduce(tuneReducer, s);
const scale = { pxPerDecade: 187.3, pxPerDb: 2.71 };
/** One whole drag of a handle by (dx, dy) pixels, in three frames as the plot sends them. */
const drag = (id: string, dx: number, dy: number): TuneAction[] => [
  { type: 'drag-start', id },
  { type: 'drag-move', dxPx: dx / 3, dyPx: dy / 3, scale },
  { type: 'drag-move', dxPx: (2 * dx) / 3, dyPx: (2 * dy) / 3, scale },
  { type: 'drag-move', dxPx: dx, dyPx: dy, scale },
  { type: 'drag-end' },
];
const vin = (s: TuneState, v: number): TuneAction => ({ type: 'edit-stage', stage: { converter: { ...s.input.converter, vin: v }, modulator: s.input.modulator, feedback: s.input.feedback } });
const crossoverOf = (s: TuneState) => {
  const prepared = prepareStage(s.input);
  if (!prepared.ok) throw new Error('stage');
  const loop = analyzeCompensator(prepared.value, s.input.compensator);
  if (!loop.ok) throw new Error('loop');
  return loop.value.margins.crossoverHz;
};

describe('Tune state: undo and redo', () => {
  it('undoes and redoes edits in order; a new edit drops the redo list', () => {
    let s = start();
    const s0 = s.input;
    s = run(s, vin(s, 20));
    const s1 = s.input;
    s = run(s, vin(s, 18));
    expect(canUndo(s)).toBe(true);
    s = run(s, { type: 'undo' });
    expect(s.input).toBe(s1);
    s = run(s, { type: 'undo' });
    expect(s.input).toBe(s0);
    expect(canUndo(s)).toBe(false);
    expect(run(s, { type: 'undo' })).toBe(s);
    s = run(s, { type: 'redo' });
    expect(s.input).toBe(s1);
    s = run(s, vin(s, 30));
    expect(canRedo(s)).toBe(false);
    expect(s.past).toEqual([s0, s1]);
  });

  it('draws the stage form again on undo and redo (it keeps its own text)', () => {
    let s = run(start(), vin(start(), 20));
    const epoch = s.stageEpoch;
    s = run(s, { type: 'undo' });
    expect(s.stageEpoch).toBe(epoch + 1);
    s = run(s, { type: 'redo' });
    expect(s.stageEpoch).toBe(epoch + 2);
  });

  it('records a whole drag as one step, and a drag back to the start as none', () => {
    let s = start();
    const before = s.input;
    s = run(s, ...drag('z0', 40, 0));
    expect(s.past).toEqual([before]);
    expect(s.input.compensator).not.toEqual(before.compensator);
    expect(run(s, { type: 'undo' }).input).toBe(before);
    // Dragged away and back within one drag: no step, and the state before it exactly.
    s = run(start(), { type: 'drag-start', id: 'gain' }, { type: 'drag-move', dxPx: 0, dyPx: 30, scale }, { type: 'drag-move', dxPx: 0, dyPx: 0, scale }, { type: 'drag-end' });
    expect(s.past).toHaveLength(0);
    expect(compareJson(s.input)).toBe(compareJson(before));
    expect(isDirty(s)).toBe(false);
  });

  it('reverses drags exactly (+25, −50, +25 px) for the gain and every zero and pole, back to the saved input', () => {
    for (const id of ['gain', 'z0', 'z1', 'p0', 'p1']) {
      let s = start();
      for (const step of [25, -50, 25]) s = run(s, ...drag(id, id === 'gain' ? 0 : step, id === 'gain' ? -step : 0));
      expect(s.past).toHaveLength(3);
      // Back on the saved input to 12 digits: the saved input itself, so nothing to save.
      expect(s.input).toBe(s.saved.input);
      expect(isDirty(s)).toBe(false);
      // And each step undoes to the state before it.
      const undone = run(s, { type: 'undo' }, { type: 'undo' }, { type: 'undo' });
      expect(compareJson(undone.input)).toBe(compareJson(start().input));
    }
  });

  it('holds the locked part during a drag', () => {
    let s = run(start(), { type: 'lock', part: 'c1' });
    const c1 = s.input.compensator.c1;
    s = run(s, ...drag('z0', 60, 0));
    expect(s.input.compensator.c1).toBe(c1);
  });

  it('adds nothing for an edit that changes nothing; keeps at most HISTORY_LIMIT steps', () => {
    let s = start();
    expect(run(s, vin(s, s.input.converter.vin))).toBe(s);
    for (let i = 1; i <= HISTORY_LIMIT + 20; i++) s = run(s, vin(s, 10 + i / 100));
    expect(s.past).toHaveLength(HISTORY_LIMIT);
  });

  it('counts unsaved changes against the last save; leaving Scratch drops every edit', () => {
    let s = run(start(), vin(start(), 20));
    expect(isDirty(s)).toBe(true);
    s = run(s, { type: 'saved', revision: 2, input: s.input });
    expect(isDirty(s)).toBe(false);
    expect(s.saved.revision).toBe(2);
    s = run(start(), { type: 'start-scratch' }, vin(start(), 20), { type: 'leave-scratch' });
    expect(s.scratch).toBe(false);
    expect(s.input).toBe(s.initial);
    expect(canUndo(s)).toBe(false);
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

describe('Tune state: edits that need the engine', () => {
  it('keeps the crossover when the compensator type changes', () => {
    const s = start();
    const prepared = prepareStage(s.input);
    if (!prepared.ok) throw new Error('stage');
    const fc = crossoverOf(s)!;
    const kept: string[] = [];
    for (const type of COMPENSATOR_TYPES) {
      const placed = placeType(prepared.value, s.input.compensator, type, { crossoverHz: fc, phaseMarginDeg: 55 });
      expect(placed.ok, type).toBe(true);
      if (!placed.ok) continue;
      const next = run(s, { type: 'set-compensator', compensator: placed.compensator });
      expect(next.input.compensator.type).toBe(type);
      // Where the type cannot give the margin at that fc (Type I and II on this ceramic-output buck), the note says fc was lowered.
      if (placed.note?.includes('fc lowered')) expect(crossoverOf(next)!, type).toBeLessThan(fc);
      else expect(crossoverOf(next)! / fc, type).toBeCloseTo(1, 2);
      // One step: undo brings the earlier type back.
      expect(run(next, { type: 'undo' }).input.compensator).toEqual(s.input.compensator);
      if (!placed.note?.includes('fc lowered')) kept.push(type);
    }
    expect(kept).toContain('type3'); // a Type III gives this LC stage the margin at its own fc
  });

  it('refuses a transconductance Type I and a placement without a power stage, naming why', () => {
    const s = start();
    const prepared = prepareStage(s.input);
    if (!prepared.ok) throw new Error('stage');
    expect(placeType(null, s.input.compensator, 'type2', { crossoverHz: 10e3, phaseMarginDeg: 60 })).toMatchObject({ ok: false, message: expect.stringContaining('power stage') });
    expect(changeAmplifier({ ...s.input.compensator, type: 'type1' }, { amplifier: 'transconductance', gm: 1e-3, rb: 10e3 })).toMatchObject({ ok: false });
  });
});
