/**
 * Handles of the compensator: its zeros (○), poles (✕) and a gain handle, as seen
 * through the engine's CompensatorShape.
 *
 * They behave as the straight-line (asymptotic) Bode plot teaches: the integrator
 * ωi/s sets the low-frequency curve, and each zero or pole bends the curve from its
 * own frequency upwards. So moving a zero or pole holds the integrator and changes
 * the curve on its far (high-frequency) side only; a pole moved down lowers the gain
 * above it, a zero moved down raises it. The gain handle scales the integrator, which
 * lifts or lowers the whole curve; it sits on the compensator curve at its own
 * frequency and reads |Gc| there.
 *
 * Which part holds its value when a handle moves is the lock (R1 by default): the
 * poles and zeros fix every time constant, and the remaining freedom, the impedance
 * level (R × k, C ÷ k), is set by the locked part.
 */
import { compensatorTransfer, partsFromShape, shapeFromParts } from '@/lib/engine/compensator';
import { transferEvaluator } from '@/lib/engine/sweep';
import { PARTS, compensatorEntry, compensatorFor, presentLandmarks, type PartKey as CatalogPartKey } from '@/lib/catalog/compensators';
import { formatSi } from '@/lib/units/si';
import { EngineInputError, type CompensatorInput, type CompensatorShape, type CompensatorType, type FieldIssue } from '@/lib/engine/types';

export type HandleKind = 'zero' | 'pole' | 'gain';

export interface HandleSpec {
  id: string;
  kind: HandleKind;
  /** Frequency the handle sits at, Hz. */
  hz: number;
  /** Short label: "Zero 1", "Pole 2", "Gain at 12 kHz". */
  label: string;
  /** The parts this handle sets. */
  parts: string;
  /** Gain handle: |Gc| at its frequency, dB (what the compensator curve shows there). */
  gainDb?: number | null;
}

/** The parts that place each zero and pole the shape has (from the catalogue). */
function poleZeroParts(shape: CompensatorShape): { zeros: string[]; poles: string[] } {
  const entry = compensatorFor(shape.type, shape.fixed?.amplifier);
  return {
    zeros: presentLandmarks(entry.zeros, shape.zerosHz.length).map((l) => l.formula),
    poles: presentLandmarks(entry.poles, shape.polesHz.length).map((l) => l.formula),
  };
}

/**
 * Where the gain handle sits: mid-way (in log f) between the highest zero and the first
 * pole above it; three times the zero without such a pole; for Type I (no zero or pole)
 * at `anchorHz`, a frequency the caller keeps still while the gain changes (e.g. the LC
 * resonance), so the handle moves only up and down.
 */
export function gainHandleHz(shape: CompensatorShape, anchorHz: number | null): number {
  const zTop = shape.zerosHz.length ? Math.max(...shape.zerosHz) : null;
  const above = shape.polesHz.filter((p) => zTop === null || p > zTop);
  const pLow = above.length ? Math.min(...above) : null;
  if (zTop !== null && pLow !== null) return Math.sqrt(zTop * pLow);
  if (zTop !== null) return zTop * 3;
  return anchorHz ?? shape.integratorHz;
}

/** |Gc(j2πf)| of a shape, dB (exact, not asymptotic); null when the shape cannot be built. */
export function compensatorGainDbAt(shape: CompensatorShape, hz: number): number | null {
  const r = compensatorFromShape(shape);
  if (!r.ok) return null;
  return transferEvaluator(compensatorTransfer(r.comp), hz)(hz).magDb;
}

export function handlesOf(shape: CompensatorShape, anchorHz: number | null): HandleSpec[] {
  const names = poleZeroParts(shape);
  const many = (n: number) => n > 1;
  const out: HandleSpec[] = [
    ...shape.zerosHz.map((hz, i) => ({
      id: `z${i}`,
      kind: 'zero' as const,
      hz,
      label: many(shape.zerosHz.length) ? `Zero ${i + 1}` : 'Zero',
      parts: names.zeros[i] ?? '',
    })),
    ...shape.polesHz.map((hz, i) => ({
      id: `p${i}`,
      kind: 'pole' as const,
      hz,
      label: many(shape.polesHz.length) ? `Pole ${i + 1}` : 'Pole',
      parts: names.poles[i] ?? '',
    })),
  ];
  const hz = gainHandleHz(shape, anchorHz);
  out.push({ id: 'gain', kind: 'gain', hz, label: `Gain at ${formatSi(hz, 'Hz')}`, parts: `the integrator, ${compensatorFor(shape.type, shape.fixed?.amplifier).gain.formula}`, gainDb: compensatorGainDbAt(shape, hz) });
  return out;
}

/** The shape with its whole curve moved by `deltaDb` (integrator frequency scaled; Gc is proportional to it). */
export function shiftGain(shape: CompensatorShape, deltaDb: number): CompensatorShape {
  return { ...shape, integratorHz: shape.integratorHz * 10 ** (deltaDb / 20) };
}

/** The shape with |Gc| at `hz` set to `gainDb` (integrator scaled; null when the shape cannot be built). */
export function setGainAt(shape: CompensatorShape, hz: number, gainDb: number): CompensatorShape | null {
  const now = compensatorGainDbAt(shape, hz);
  return now === null ? null : shiftGain(shape, gainDb - now);
}

/**
 * The shape with one zero or pole moved to `hz`, the integrator held: the curve below the
 * lower of the old and new frequency stays (asymptotically) where it was, the curve above
 * both moves by the ratio of the two (down for a pole moved down, up for a zero moved down).
 */
export function moveFrequency(shape: CompensatorShape, id: string, hz: number): CompensatorShape {
  const i = Number(id.slice(1));
  if (id.startsWith('z')) return { ...shape, zerosHz: shape.zerosHz.map((v, k) => (k === i ? hz : v)) };
  if (id.startsWith('p')) return { ...shape, polesHz: shape.polesHz.map((v, k) => (k === i ? hz : v)) };
  return shape;
}

/** Pixels per decade of frequency and per dB of magnitude, as the plot draws them during a drag. */
export interface DragScale {
  pxPerDecade: number;
  pxPerDb: number;
}

/** A handle's move: a new frequency for a zero or pole, or a gain change in dB for the gain handle. */
export interface HandleMove {
  /** New frequency for a zero or pole, Hz. */
  hz?: number;
  /** Gain change for the gain handle, dB, counted from the start of the drag (or one key step). */
  deltaDb?: number;
}

const handleHz = (shape: CompensatorShape, id: string): number | undefined =>
  id.startsWith('z') ? shape.zerosHz[Number(id.slice(1))] : id.startsWith('p') ? shape.polesHz[Number(id.slice(1))] : undefined;

/**
 * The move of a pointer offset from where the drag started (screen px; y grows downwards): a
 * zero or pole by dx/pxPerDecade decades from where it was, the gain by −dy/pxPerDb dB. Moves
 * are relative to the handle, never to the pointer's absolute place, so with the same scale a
 * drag of +a px followed by one of −a px returns to the start (up to rounding, ~1e-15).
 */
export function moveFromDrag(base: CompensatorShape, id: string, dxPx: number, dyPx: number, scale: DragScale): HandleMove {
  if (id === 'gain') return { deltaDb: -dyPx / scale.pxPerDb };
  const hz = handleHz(base, id);
  return hz === undefined ? {} : { hz: hz * 10 ** (dxPx / scale.pxPerDecade) };
}

/** The shape after a handle's move. */
export function applyMove(base: CompensatorShape, id: string, move: HandleMove): CompensatorShape {
  if (id === 'gain') return shiftGain(base, move.deltaDb ?? 0);
  return move.hz !== undefined ? moveFrequency(base, id, move.hz) : base;
}

/** A drag applied to the shape it started from (see moveFromDrag). */
export function dragShape(base: CompensatorShape, id: string, dxPx: number, dyPx: number, scale: DragScale): CompensatorShape {
  return applyMove(base, id, moveFromDrag(base, id, dxPx, dyPx, scale));
}

/** A compensator part (the divider's Rb is not one: it follows R1). */
export type PartKey = Exclude<CatalogPartKey, 'rb'>;
/** Parts a compensator type has, in the catalogue's order. */
export const partsOfType = (type: CompensatorType): readonly PartKey[] => compensatorEntry(type).parts.filter((p): p is PartKey => p !== 'rb');

/** A part that holds its value while the handles move; R1 unless the designer locks another. */
export interface PartLock {
  part: PartKey;
  /** The value it holds, Ω or F. */
  value: number;
}

const isResistor = (p: PartKey) => p.startsWith('r');

/**
 * Every part multiplied by the impedance level k (resistors × k, capacitors ÷ k): every time
 * constant, and so every pole, zero and the integrator frequency, stays.
 */
export function scaleImpedance(comp: CompensatorInput, k: number): CompensatorInput {
  const r = (v: number | undefined) => (v === undefined ? undefined : v * k);
  const c = (v: number | undefined) => (v === undefined ? undefined : v / k);
  // The amplifier's own values (op-amp model) are not parts of the network and stay.
  const out: CompensatorInput = { type: comp.type, r1: comp.r1 * k, c1: comp.c1 / k, ...(comp.amplifier ? { amplifier: comp.amplifier } : {}), ...(comp.opamp ? { opamp: comp.opamp } : {}) };
  if (comp.type !== 'type1') Object.assign(out, { r2: r(comp.r2), c2: c(comp.c2) });
  if (comp.type === 'type3') Object.assign(out, { r3: r(comp.r3), c3: c(comp.c3) });
  return out;
}

/**
 * Parts for a shape, or the reason the shape cannot be built (a pole at or below its zero).
 * With a lock, the impedance level is chosen so the locked part keeps its value; a lock on a
 * part the type does not have, or on an absent C2, is ignored (R1 then holds).
 */
export function compensatorFromShape(shape: CompensatorShape, lock: PartLock | null = null): { ok: true; comp: CompensatorInput } | { ok: false; issues: FieldIssue[] } {
  let comp: CompensatorInput;
  try {
    comp = partsFromShape(shape);
  } catch (err) {
    if (err instanceof EngineInputError) return { ok: false, issues: err.issues };
    throw err;
  }
  // Around a gm amplifier the gain is gm·H·Zo: scaling the network's impedance would change
  // it, so R1 (with gm and Rb) holds there.
  if (!lock || lock.part === 'r1' || !(lock.value > 0) || comp.amplifier === 'transconductance') return { ok: true, comp };
  const now = comp[lock.part];
  if (now === undefined || !(now > 0)) return { ok: true, comp };
  const k = isResistor(lock.part) ? lock.value / now : now / lock.value;
  const scaled = scaleImpedance(comp, k);
  // The locked part gets its value exactly, not k·v rounded.
  return { ok: true, comp: { ...scaled, [lock.part]: lock.value } };
}


/**
 * The compensator with one part typed in; the poles, zeros and integrator follow from the
 * parts. C2 may be 0 (absent); every other part must be above 0. The new shape is checked
 * as the handles would be (poles above their zeros come from positive parts by construction).
 */
export function withPart(comp: CompensatorInput, part: PartKey, value: number): { ok: true; comp: CompensatorInput } | { ok: false; message: string } {
  const name = PARTS[part].name;
  if (!partsOfType(comp.type).includes(part)) return { ok: false, message: `${name} is not a part of this compensator type` };
  if (!Number.isFinite(value)) return { ok: false, message: `${name} must be a number` };
  if (part === 'c2' ? value < 0 : !(value > 0)) return { ok: false, message: part === 'c2' ? 'C2 cannot be negative (0 = absent)' : `${name} must be above 0` };
  return { ok: true, comp: { ...comp, [part]: value } };
}

export { shapeFromParts };
