/**
 * The Tune screen's state in one place. Read it top to bottom:
 *
 *  1. `TuneState` — what the screen holds: the design input with its undo and redo lists, the
 *     saved input (to tell unsaved changes), Scratch, a handle drag in progress, the lock, …
 *  2. `TuneAction` — everything that can happen to it.
 *  3. `tuneReducer` — how each action changes it. Every edit of the design is one step to
 *     undo; a whole drag is one step however many frames it has.
 *  4. Selectors (`canUndo`, `isDirty`, `lockOf`) and the edits that need the prepared plant
 *     first (`placeType`, `proposeStart`, `changeAmplifier`): they answer the compensator to
 *     dispatch or the message to show beside the control.
 *
 * Pure (no React): the screen keeps it with `useReducer`, the tests drive it as the screen does.
 * Derived values (the prepared plant, the loop, the parts) are memoised in the screen from
 * `state.input`, never stored here.
 */
import { partsFromShape } from '@/lib/engine/compensator';
import { placeForType, proposeForPlant } from '@/lib/engine/starting-point';
import type { PreparedPlant } from '@/lib/engine/analyze';
import { withRange, type MarginTargets, type OperatingRange } from '@/lib/engine/range';
import { EngineInputError, type AnalyzeRequest, type CompensatorInput, type CompensatorShape, type CompensatorType, type PartsOptions, type SweepOptions } from '@/lib/engine/types';
import { formatSi } from '@/lib/units/si';
import type { DesignInput } from '@/components/range/use-range-analysis';
import type { TuneView } from '@/components/time-domain/tune-view-switch';
import type { AmplifierValues } from './amplifier-form';
import { compensatorFromShape, dragShape, partsOfType, shapeFromParts, type DragScale, type PartKey, type PartLock } from './handles';

// ─── 1. The state ──────────────────────────────────────────────────────────────────────────────

export interface TuneState {
  /** The design as edited now. The operating range is written out (defaults filled), so every save stores it. */
  input: DesignInput;
  /** Earlier inputs, newest last (undo takes from here), and undone ones, next first (redo). */
  past: DesignInput[];
  future: DesignInput[];
  /** The shown revision's input, or the last save's: an edit landing back on it (to rounding) takes it itself. */
  saved: { input: DesignInput; json: string; revision: number | null };
  /** What the screen opened with; leaving Scratch returns to it. */
  initial: DesignInput;
  /** Editing from this earlier revision: its input is loaded as unsaved changes, until the first save. */
  editFrom: number | null;
  /** A what-if by a reader or on an earlier revision: everything edits, nothing is saved. */
  scratch: boolean;
  /** A handle drag in progress: moves are relative to the shape it started from; `recorded` once it is a step in the history. */
  drag: { id: string; base: CompensatorShape; recorded: boolean } | null;
  /** Why the last handle move or typed value was refused (shown under the plot). */
  handleProblem: string | null;
  /** The part that keeps its value when a handle moves (the impedance level follows it). */
  lockPart: PartKey;
  /** The starting-point form's phase margin target; a type change places for it. */
  pmTargetDeg: number | null;
  /** False while a power-stage field holds text that is not a number (the stage form keeps its own text). */
  stageValid: boolean;
  /** Bumped when undo, redo or leaving Scratch change the stage under the stage form, so it is drawn again. */
  stageEpoch: number;
  view: TuneView;
}

/** How many edits are kept to undo. */
export const HISTORY_LIMIT = 200;

export function initTuneState({
  initialInput,
  savedInput,
  shownRevision,
  editFrom = null,
}: {
  initialInput: AnalyzeRequest;
  savedInput?: AnalyzeRequest;
  shownRevision: number | null;
  editFrom?: number | null;
}): TuneState {
  const saved = withRange(savedInput ?? initialInput);
  return {
    input: withRange(initialInput),
    past: [],
    future: [],
    saved: { input: saved, json: compareJson(saved), revision: shownRevision },
    initial: withRange(initialInput),
    editFrom,
    scratch: false,
    drag: null,
    handleProblem: null,
    lockPart: 'r1',
    pmTargetDeg: null,
    stageValid: true,
    stageEpoch: 0,
    view: 'loop',
  };
}

// ─── 2. What can happen ────────────────────────────────────────────────────────────────────────

export type StageEdit = Pick<AnalyzeRequest, 'converter' | 'modulator' | 'feedback'>;

export type TuneAction =
  // Edits of the design (each one step to undo).
  | { type: 'edit-stage'; stage: StageEdit }
  | { type: 'edit-series'; parts: PartsOptions }
  | { type: 'edit-step'; step: NonNullable<AnalyzeRequest['step']> }
  | { type: 'edit-range'; range: OperatingRange; targets: MarginTargets }
  /** undefined: back to the default sweep for the stage. */
  | { type: 'edit-sweep'; sweep: SweepOptions | undefined }
  /** A compensator from the handle table, a typed part, a type change, the amplifier or the starting point. */
  | { type: 'set-compensator'; compensator: CompensatorInput }
  // A handle drag: frames are offsets from where the drag started.
  | { type: 'drag-start'; id: string }
  | { type: 'drag-move'; dxPx: number; dyPx: number; scale: DragScale }
  | { type: 'drag-end' }
  | { type: 'undo' }
  | { type: 'redo' }
  | { type: 'start-scratch' }
  | { type: 'leave-scratch' }
  | { type: 'saved'; revision: number; input: AnalyzeRequest }
  /** A handle move or typed value the compensator cannot take (the locked part held). */
  | { type: 'refuse'; message: string }
  | { type: 'lock'; part: PartKey }
  | { type: 'pm-target'; deg: number | null }
  | { type: 'stage-validity'; valid: boolean }
  | { type: 'view'; view: TuneView };

// ─── 3. How each action changes the state ──────────────────────────────────────────────────────

export function tuneReducer(s: TuneState, a: TuneAction): TuneState {
  switch (a.type) {
    case 'edit-stage':
      return edit(s, { ...s.input, ...a.stage });
    case 'edit-series':
      return edit(s, { ...s.input, parts: a.parts });
    case 'edit-step':
      return edit(s, { ...s.input, step: a.step });
    case 'edit-range':
      return edit(s, { ...s.input, range: a.range, targets: a.targets });
    case 'edit-sweep': {
      const { sweep: _default, ...rest } = s.input;
      return edit(s, a.sweep ? { ...rest, sweep: a.sweep } : rest);
    }
    case 'set-compensator':
      return { ...edit(s, { ...s.input, compensator: a.compensator }), handleProblem: null };

    case 'drag-start':
      return { ...s, drag: { id: a.id, base: shapeFromParts(s.input.compensator), recorded: false } };
    case 'drag-move': {
      if (!s.drag) return s;
      const r = compensatorFromShape(dragShape(s.drag.base, s.drag.id, a.dxPx, a.dyPx, a.scale), lockOf(s));
      if (!r.ok) return { ...s, handleProblem: refusal(r.issues) };
      const next = { ...s.input, compensator: r.comp };
      // The first frame that changes something is one step in the history; the rest of the drag replaces it.
      if (s.drag.recorded) return { ...s, input: next, handleProblem: null };
      const edited = edit(s, next);
      return { ...edited, drag: { ...s.drag, recorded: edited.past !== s.past }, handleProblem: null };
    }
    case 'drag-end': {
      if (!s.drag) return s;
      const ended = { ...s, drag: null };
      if (!s.drag.recorded) return ended;
      // A drag that ended where it began is no step: the state before it comes back exactly
      // (not the rounding-level copy the drag left); one that ended on the saved input takes it.
      const before = s.past[s.past.length - 1];
      if (before !== undefined && sameInput(before, s.input)) return { ...ended, past: s.past.slice(0, -1), input: before };
      return { ...ended, input: snapToSaved(s, s.input) };
    }

    case 'undo': {
      if (s.past.length === 0) return s;
      return { ...s, past: s.past.slice(0, -1), input: s.past[s.past.length - 1], future: [s.input, ...s.future], stageEpoch: s.stageEpoch + 1 };
    }
    case 'redo': {
      if (s.future.length === 0) return s;
      return { ...s, past: [...s.past, s.input], input: s.future[0], future: s.future.slice(1), stageEpoch: s.stageEpoch + 1 };
    }

    case 'start-scratch':
      return { ...s, scratch: true };
    case 'leave-scratch':
      // Everything tried in Scratch is dropped, its undo list too.
      return { ...s, scratch: false, input: s.initial, past: [], future: [], drag: null, handleProblem: null, stageEpoch: s.stageEpoch + 1 };
    case 'saved': {
      const input = withRange(a.input);
      return { ...s, saved: { input, json: compareJson(input), revision: a.revision }, editFrom: null };
    }

    case 'refuse':
      return { ...s, handleProblem: a.message };
    case 'lock':
      return { ...s, lockPart: a.part };
    case 'pm-target':
      return { ...s, pmTargetDeg: a.deg };
    case 'stage-validity':
      return { ...s, stageValid: a.valid };
    case 'view':
      return { ...s, view: a.view };
  }
}

/**
 * An edit of the design: the present goes to the undo list and the redo list is dropped. An
 * edit that changes nothing (to rounding) adds no step; one landing on the saved input takes it.
 */
function edit(s: TuneState, next: DesignInput): TuneState {
  if (sameInput(s.input, next)) return s;
  const past = [...s.past, s.input];
  return { ...s, past: past.length > HISTORY_LIMIT ? past.slice(past.length - HISTORY_LIMIT) : past, input: snapToSaved(s, next), future: [] };
}

const snapToSaved = (s: TuneState, next: DesignInput): DesignInput => (compareJson(next) === s.saved.json ? s.saved.input : next);

const refusal = (issues: { message: string }[]) => issues[0]?.message ?? 'that placement is not possible';

// ─── 4. Selectors and the edits that need the engine ───────────────────────────────────────────

export const canUndo = (s: TuneState) => s.past.length > 0;
export const canRedo = (s: TuneState) => s.future.length > 0;

/** Unsaved changes, or a stage field that is not a number: the save bar offers saving, leaving asks first. */
export const isDirty = (s: TuneState) => compareJson(s.input) !== s.saved.json || !s.stageValid;

/** The locked part and its value, when the compensator type has that part and it has a value. */
export function lockOf(s: Pick<TuneState, 'input' | 'lockPart'>): PartLock | null {
  const value = s.input.compensator[s.lockPart];
  return partsOfType(s.input.compensator.type).includes(s.lockPart) && value !== undefined && value > 0 ? { part: s.lockPart, value } : null;
}

export type Placed = { ok: true; compensator: CompensatorInput; note: string | null } | { ok: false; message: string };

const NO_STAGE = 'Fix the power stage first: the loop cannot be placed without it.';
const GM_TYPES = 'A transconductance amplifier is modelled for Type II and Type III';

/** Another compensator type, placed for the same crossover and the phase margin target. */
export function placeType(
  prepared: PreparedPlant | null,
  comp: CompensatorInput,
  type: CompensatorType,
  { crossoverHz, phaseMarginDeg }: { crossoverHz: number; phaseMarginDeg: number },
): Placed {
  if (!prepared) return { ok: false, message: NO_STAGE };
  if (type === 'type1' && comp.amplifier === 'transconductance') return { ok: false, message: `${GM_TYPES}: choose the op-amp first for Type I.` };
  return attempt(() => {
    const placed = placeForType(prepared, { type, crossoverHz, phaseMarginDeg, r1: comp.r1, fixed: shapeFromParts(comp).fixed });
    return {
      compensator: placed.compensator,
      note: placed.note ?? `Placed for the same fc (${formatSi(crossoverHz, 'Hz')}) and PM target (${phaseMarginDeg.toFixed(0)}°).`,
    };
  });
}

/** The starting-point form's proposal (K factor or pole-zero rules) for the stage. */
export function proposeStart(
  prepared: PreparedPlant | null,
  comp: CompensatorInput,
  target: Omit<Parameters<typeof proposeForPlant>[1], 'r1' | 'fixed'>,
): Placed {
  if (!prepared) return { ok: false, message: NO_STAGE };
  return attempt(() => ({ compensator: proposeForPlant(prepared, { ...target, r1: comp.r1, fixed: shapeFromParts(comp).fixed }), note: null }));
}

/** A new amplifier or new amplifier values: the placed poles and zeros stay, the parts follow. */
export function changeAmplifier(comp: CompensatorInput, values: AmplifierValues): Placed {
  if (values.amplifier === 'transconductance' && comp.type === 'type1') return { ok: false, message: `${GM_TYPES}: choose one of them first.` };
  return attempt(() => ({ compensator: partsFromShape({ ...shapeFromParts(comp), fixed: values }), note: null }));
}

function attempt(fn: () => { compensator: CompensatorInput; note: string | null }): Placed {
  try {
    return { ok: true, ...fn() };
  } catch (err) {
    return { ok: false, message: err instanceof EngineInputError ? (err.issues[0]?.message ?? err.message) : err instanceof Error ? err.message : String(err) };
  }
}

/** The key press that undoes or redoes: Ctrl/⌘+Z, Ctrl/⌘+Shift+Z (and Ctrl+Y). */
export function historyKey(e: { key: string; ctrlKey: boolean; metaKey: boolean; shiftKey: boolean; altKey: boolean }): 'undo' | 'redo' | null {
  if (!(e.ctrlKey || e.metaKey) || e.altKey) return null;
  const k = e.key.toLowerCase();
  if (k === 'z') return e.shiftKey ? 'redo' : 'undo';
  if (k === 'y' && !e.shiftKey) return 'redo';
  return null;
}

/**
 * JSON with sorted keys, so two inputs compare equal whatever order their keys were written in;
 * with `digits`, numbers rounded to that many significant digits.
 */
export function stableJson(v: unknown, digits?: number): string {
  return JSON.stringify(v, (_k, val) =>
    val && typeof val === 'object' && !Array.isArray(val)
      ? Object.fromEntries(Object.entries(val).sort(([a], [b]) => a.localeCompare(b)))
      : digits && typeof val === 'number' && Number.isFinite(val)
        ? Number(val.toPrecision(digits))
        : val,
  );
}

/**
 * Inputs compare to 12 significant digits: a handle dragged away and back returns through
 * floating-point products (~1e-16 off), which is the same circuit and no change to save.
 */
export const compareJson = (v: unknown) => stableJson(v, 12);

const sameInput = (a: DesignInput, b: DesignInput) => a === b || compareJson(a) === compareJson(b);
