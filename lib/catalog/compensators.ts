/**
 * The compensator registry: for each compensator type its name, the parts it
 * uses and their roles, and which part sets each zero, pole and the gain
 * handle. The handle table, the parts tables, the revision diff, the report,
 * the netlist comments and the starting-point form read from here.
 *
 * Adding a compensator variant = its transfer function in lib/engine, one
 * entry in COMPENSATORS below (and parts in PARTS if it has new ones), tests.
 */
import type { Amplifier, CompensatorType, PartValues } from '../engine/types';

export type PartKey = keyof PartValues;

export interface PartSpec {
  /** Schematic name: "R2". */
  name: string;
  kind: 'resistor' | 'capacitor';
  unit: 'Ω' | 'F';
  /** Where it sits in the network (used when a type does not say otherwise). */
  role: string;
}

/** Every part a compensator or its divider may have; the engine's PartValues keys. */
export const PARTS = {
  r1: { name: 'R1', kind: 'resistor', unit: 'Ω', role: 'output to inverting input' },
  r2: { name: 'R2', kind: 'resistor', unit: 'Ω', role: 'feedback, in series with C1' },
  c1: { name: 'C1', kind: 'capacitor', unit: 'F', role: 'feedback, in series with R2' },
  c2: { name: 'C2', kind: 'capacitor', unit: 'F', role: 'across the feedback path' },
  r3: { name: 'R3', kind: 'resistor', unit: 'Ω', role: 'in series with C3, across R1' },
  c3: { name: 'C3', kind: 'capacitor', unit: 'F', role: 'in series with R3, across R1' },
  rb: { name: 'Rb', kind: 'resistor', unit: 'Ω', role: 'lower divider resistor (sets Vout)' },
} as const satisfies Record<PartKey, PartSpec>;

/** The error amplifier's own numbers (not parts): the gm stage's and the finite op-amp's. */
export interface AmplifierInputSpec {
  /** Words first: "Transconductance". */
  label: string;
  symbol: string;
  unit: 'S' | 'Ω' | 'V/V' | 'Hz';
  /** What leaving it out means, where it means something. */
  absentMeans?: string;
}

export const AMPLIFIER_INPUTS = {
  gm: { label: 'Transconductance', symbol: 'gm', unit: 'S' },
  ro: { label: 'Amplifier output resistance', symbol: 'ro', unit: 'Ω', absentMeans: 'infinite' },
  a0: { label: 'Op-amp open-loop gain', symbol: 'a0', unit: 'V/V' },
  gbw: { label: 'Op-amp gain-bandwidth', symbol: 'GBW', unit: 'Hz' },
} as const satisfies Record<string, AmplifierInputSpec>;

/** "Transconductance gm" — as a form label or a table row. */
export const amplifierInputLabel = (key: keyof typeof AMPLIFIER_INPUTS): string => `${AMPLIFIER_INPUTS[key].label} ${AMPLIFIER_INPUTS[key].symbol}`;

/** Display order of parts in tables and files. */
export const PART_ORDER = ['r1', 'r2', 'c1', 'c2', 'r3', 'c3', 'rb'] as const satisfies readonly PartKey[];

/** A zero or pole of the compensator and the parts that place it. */
export interface Landmark {
  /** The time constant as engineers write it: "R2·C1". */
  formula: string;
  parts: readonly PartKey[];
  /** Absent when one of its parts is 0 (C2 = 0 removes the high-frequency pole). */
  optional?: boolean;
}

export interface CompensatorEntry {
  type: CompensatorType;
  /** "Type II". */
  label: string;
  /** "one zero, one pole". */
  summary: string;
  amplifier: Amplifier;
  /** The parts this type uses (the divider's Rb is always added), in PART_ORDER. */
  parts: readonly PartKey[];
  /** Roles that differ from PARTS[key].role in this type. */
  roles?: Partial<Record<PartKey, string>>;
  /** Zeros and poles in the order the engine's CompensatorShape lists them (origin pole excluded). */
  zeros: readonly Landmark[];
  poles: readonly Landmark[];
  /** What the gain handle moves. */
  gain: Landmark;
  /** The integrator's 0 dB frequency as engineers write it: "1/(2π·R1·(C1+C2))". */
  integrator: string;
  /** What R1 does when typed (the handles keep the poles and zeros). */
  r1Note: string;
  /** Most phase boost the type can add at crossover, degrees (K-factor method). */
  maxBoostDeg: number;
  /**
   * The same type around a transconductance amplifier, where it differs: the network sits at
   * the amplifier's output (COMP to ground) and the divider is inside the loop, so the gain and
   * the feed-forward pole carry the divider (lib/engine/compensator.ts gives the transfer).
   */
  transconductance?: AmplifierVariant;
}

/** What changes in an entry when the amplifier is not the op-amp. */
export type AmplifierVariant = Pick<CompensatorEntry, 'zeros' | 'poles' | 'gain' | 'integrator' | 'r1Note'> & {
  roles: Partial<Record<PartKey, string>>;
};

/** Part roles around a transconductance amplifier (any type). */
const GM_ROLES: Partial<Record<PartKey, string>> = {
  r1: 'divider top, output to the feedback pin',
  r2: 'COMP to ground, in series with C1',
  c1: 'COMP to ground, in series with R2',
  c2: 'COMP to ground',
  r3: 'in series with C3, across R1',
  c3: 'in series with R3, across R1',
  rb: 'divider bottom (sets Vout; in the loop gain)',
};

/** gm·H0/(C1+C2) with the divider's DC gain H0 = Rb/(R1+Rb). */
const GM_GAIN: Landmark = { formula: 'gm·Rb/((R1+Rb)·(C1+C2))', parts: ['r1', 'rb', 'c1', 'c2'] };
const GM_INTEGRATOR = 'gm·Rb/(2π·(R1+Rb)·(C1+C2))';
const GM_R1_NOTE = 'divider top: with Rb sets Vout and the divider gain Rb/(R1+Rb); poles and zeros stay';

export const COMPENSATORS: Readonly<Record<CompensatorType, CompensatorEntry>> = {
  type1: {
    type: 'type1',
    label: 'Type I',
    summary: 'integrator',
    amplifier: 'opamp',
    parts: ['r1', 'c1'],
    roles: { c1: 'feedback capacitor (integrator)' },
    zeros: [],
    poles: [],
    gain: { formula: 'R1·C1', parts: ['r1', 'c1'] },
    integrator: '1/(2π·R1·C1)',
    r1Note: 'scales every part; poles and zeros stay',
    maxBoostDeg: 0,
  },
  type2: {
    type: 'type2',
    label: 'Type II',
    summary: 'one zero, one pole',
    amplifier: 'opamp',
    parts: ['r1', 'r2', 'c1', 'c2'],
    zeros: [{ formula: 'R2·C1', parts: ['r2', 'c1'] }],
    poles: [{ formula: 'C2', parts: ['c2'], optional: true }],
    gain: { formula: 'R1·(C1+C2)', parts: ['r1', 'c1', 'c2'] },
    integrator: '1/(2π·R1·(C1+C2))',
    r1Note: 'scales every part; poles and zeros stay',
    maxBoostDeg: 90,
    transconductance: {
      roles: GM_ROLES,
      zeros: [{ formula: 'R2·C1', parts: ['r2', 'c1'] }],
      poles: [{ formula: 'C2', parts: ['c2'], optional: true }],
      gain: GM_GAIN,
      integrator: GM_INTEGRATOR,
      r1Note: GM_R1_NOTE,
    },
  },
  type3: {
    type: 'type3',
    label: 'Type III',
    summary: 'two zeros, two poles',
    amplifier: 'opamp',
    parts: ['r1', 'r2', 'c1', 'c2', 'r3', 'c3'],
    zeros: [
      { formula: 'R2·C1', parts: ['r2', 'c1'] },
      { formula: '(R1+R3)·C3', parts: ['r1', 'r3', 'c3'] },
    ],
    poles: [
      { formula: 'C2', parts: ['c2'], optional: true },
      { formula: 'R3·C3', parts: ['r3', 'c3'] },
    ],
    gain: { formula: 'R1·(C1+C2)', parts: ['r1', 'c1', 'c2'] },
    integrator: '1/(2π·R1·(C1+C2))',
    r1Note: 'scales every part; poles and zeros stay',
    maxBoostDeg: 180,
    transconductance: {
      roles: GM_ROLES,
      zeros: [
        { formula: 'R2·C1', parts: ['r2', 'c1'] },
        { formula: '(R1+R3)·C3', parts: ['r1', 'r3', 'c3'] },
      ],
      poles: [
        { formula: 'C2', parts: ['c2'], optional: true },
        // The tap sees R1 ∥ Rb, not a virtual ground.
        { formula: '(R3+R1∥Rb)·C3', parts: ['r3', 'r1', 'rb', 'c3'] },
      ],
      gain: GM_GAIN,
      integrator: GM_INTEGRATOR,
      r1Note: GM_R1_NOTE,
    },
  },
};

export const compensatorEntry = (type: CompensatorType): CompensatorEntry => COMPENSATORS[type];

/** The entry as it reads around the given amplifier (op-amp when absent): formulas, roles, landmarks. */
export function compensatorFor(type: CompensatorType, amplifier: Amplifier | undefined): CompensatorEntry {
  const e = COMPENSATORS[type];
  const v = amplifier === 'transconductance' ? e.transconductance : undefined;
  if (!v) return e;
  return { ...e, ...v, amplifier: 'transconductance', roles: { ...e.roles, ...v.roles } };
}

/** "Type II". */
export const compensatorLabel = (type: CompensatorType): string => COMPENSATORS[type].label;

/** "Type II (one zero, one pole)". */
export const compensatorTitle = (type: CompensatorType): string => `${COMPENSATORS[type].label} (${COMPENSATORS[type].summary})`;

/** A part's role in this type's network. */
export const partRole = (type: CompensatorType, part: PartKey, amplifier?: Amplifier): string => {
  return compensatorFor(type, amplifier).roles?.[part] ?? PARTS[part].role;
};

/**
 * The landmarks a shape actually has: when it lists fewer poles (or zeros) than the
 * entry, the optional ones are the missing ones.
 */
export function presentLandmarks(list: readonly Landmark[], count: number): Landmark[] {
  let drop = list.length - count;
  return list.filter((l) => !(l.optional && drop-- > 0));
}

/** Which zeros, poles and gain a part sets in a type: "Zero 1, gain". Empty when none. */
export function landmarksSetBy(type: CompensatorType, part: PartKey, amplifier?: Amplifier): string[] {
  const e = compensatorFor(type, amplifier);
  const name = (kind: string, list: readonly Landmark[], i: number) => (list.length > 1 ? `${kind} ${i + 1}` : kind);
  return [
    ...e.zeros.flatMap((z, i) => (z.parts.includes(part) ? [name('zero', e.zeros, i)] : [])),
    ...e.poles.flatMap((p, i) => (p.parts.includes(part) ? [name('pole', e.poles, i)] : [])),
    ...(e.gain.parts.includes(part) ? ['gain'] : []),
  ];
}
