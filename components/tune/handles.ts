/**
 * Handles of the compensator: its zeros (○), poles (✕) and a mid-band gain
 * handle, as seen through the engine's CompensatorShape (R1 held fixed).
 * Moving a zero or pole changes its frequency; moving the gain scales the
 * integrator frequency, which lifts the whole compensator curve.
 */
import { partsFromShape, shapeFromParts, summarizeCompensator } from '@/lib/engine/compensator';
import { EngineInputError, type CompensatorInput, type CompensatorShape, type FieldIssue } from '@/lib/engine/types';

export type HandleKind = 'zero' | 'pole' | 'gain';

export interface HandleSpec {
  id: string;
  kind: HandleKind;
  /** Frequency the handle sits at, Hz. */
  hz: number;
  /** Short label: "Zero 1", "Pole 2", "Gain". */
  label: string;
  /** The parts this handle sets. */
  parts: string;
}

function poleZeroParts(shape: CompensatorShape): { zeros: string[]; poles: string[] } {
  if (shape.type === 'type1') return { zeros: [], poles: [] };
  if (shape.type === 'type2') return { zeros: ['R2·C1'], poles: ['C2'] };
  const poles = shape.polesHz.length > 1 ? ['C2', 'R3·C3'] : ['R3·C3'];
  return { zeros: ['R2·C1', '(R1+R3)·C3'], poles };
}

/** Where the gain handle sits: mid-way (in log f) between the highest zero and the first pole above it. */
export function gainHandleHz(shape: CompensatorShape, crossoverHz: number | null): number {
  const zTop = shape.zerosHz.length ? Math.max(...shape.zerosHz) : null;
  const above = shape.polesHz.filter((p) => zTop === null || p > zTop);
  const pLow = above.length ? Math.min(...above) : null;
  if (zTop !== null && pLow !== null) return Math.sqrt(zTop * pLow);
  if (zTop !== null) return zTop * 3;
  return crossoverHz ?? shape.integratorHz;
}

export function handlesOf(shape: CompensatorShape, crossoverHz: number | null): HandleSpec[] {
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
  out.push({ id: 'gain', kind: 'gain', hz: gainHandleHz(shape, crossoverHz), label: 'Gain', parts: 'integrator (R1·(C1+C2))' });
  return out;
}

/** The shape with its mid-band gain changed by `deltaDb` (integrator frequency scaled; Gc is proportional to it). */
export function shiftGain(shape: CompensatorShape, deltaDb: number): CompensatorShape {
  return { ...shape, integratorHz: shape.integratorHz * 10 ** (deltaDb / 20) };
}

const midbandDb = (shape: CompensatorShape): number | null => {
  try {
    return summarizeCompensator(partsFromShape(shape)).midbandGainDb;
  } catch {
    return null;
  }
};

/**
 * The shape with one zero or pole moved to `hz`, the mid-band gain held: moving
 * a zero reshapes the phase without lifting the flat part of the curve (and so
 * without shifting the crossover much).
 */
export function moveFrequency(shape: CompensatorShape, id: string, hz: number): CompensatorShape {
  const i = Number(id.slice(1));
  const moved = id.startsWith('z')
    ? { ...shape, zerosHz: shape.zerosHz.map((v, k) => (k === i ? hz : v)) }
    : id.startsWith('p')
      ? { ...shape, polesHz: shape.polesHz.map((v, k) => (k === i ? hz : v)) }
      : shape;
  const before = midbandDb(shape);
  const after = midbandDb(moved);
  return before === null || after === null ? moved : shiftGain(moved, before - after);
}

/** Parts for a shape, or the reason the shape cannot be built (a pole at or below its zero). */
export function compensatorFromShape(shape: CompensatorShape): { ok: true; comp: CompensatorInput } | { ok: false; issues: FieldIssue[] } {
  try {
    return { ok: true, comp: partsFromShape(shape) };
  } catch (err) {
    if (err instanceof EngineInputError) return { ok: false, issues: err.issues };
    throw err;
  }
}

export { shapeFromParts };
