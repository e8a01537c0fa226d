/**
 * What changed between two revisions: every input, part, margin and a few
 * operating-point figures, side by side, each row marked when it differs.
 * Pure data; Compare formats it.
 */
import { AMPLIFIER_INPUTS, AMPLIFIER_LABELS, amplifierInputLabel, compensatorLabel, inputApplies, inputLabel, MODULATOR_MODE_LABELS, PART_ORDER, PARTS, readInput, STAGE_INPUTS, type InputSpec, type PartKey } from '@/lib/catalog';
import type { AnalyzeRequest } from '@/lib/engine/types';
import type { RevisionSummary } from './revision-summary';

/** How a value is shown: SI-prefixed with a unit, degrees, decibels, a ratio as %, or plain text. */
export type DiffKind = 'si' | 'deg' | 'db' | 'percent' | 'text';

export interface DiffRow {
  group: string;
  key: string;
  label: string;
  kind: DiffKind;
  unit?: string;
  a: number | string | null;
  b: number | string | null;
  changed: boolean;
  /** Whether a higher number is better (margins): colours the change. */
  higherIsBetter?: boolean;
}

export interface RevisionSide {
  input: AnalyzeRequest;
  summary: RevisionSummary;
}

type Spec = Omit<DiffRow, 'a' | 'b' | 'changed'> & { get: (s: RevisionSide) => number | string | null | undefined };

const COMP_PARTS = PART_ORDER.filter((p): p is Exclude<PartKey, 'rb'> => p !== 'rb');

/** A stage input's row, from the catalogue; blank when the input does not apply in that revision's mode. */
const stageSpec = (spec: InputSpec): Spec => ({
  group: spec.group,
  key: spec.field,
  label: inputLabel(spec),
  kind: 'si',
  unit: spec.unit,
  get: (s) => (inputApplies(spec, s.input) ? readInput(s.input, spec) : null),
});

const SPECS: Spec[] = [
  { group: 'Power stage', key: 'topology', label: 'Topology', kind: 'text', get: (s) => s.input.converter.topology },
  ...STAGE_INPUTS.filter((spec) => spec.section === 'converter').map(stageSpec),
  { group: 'Modulator', key: 'mode', label: 'Modulator', kind: 'text', get: (s) => MODULATOR_MODE_LABELS[s.input.modulator.mode ?? 'voltage'] },
  ...STAGE_INPUTS.filter((spec) => spec.section !== 'converter').map(stageSpec),
  { group: 'Compensator', key: 'type', label: 'Type', kind: 'text', get: (s) => compensatorLabel(s.input.compensator.type) },
  { group: 'Compensator', key: 'amplifier', label: 'Error amplifier', kind: 'text', get: (s) => AMPLIFIER_LABELS[s.input.compensator.amplifier ?? 'opamp'] },
  { group: 'Compensator', key: 'comp.gm', label: amplifierInputLabel('gm'), kind: 'si', unit: AMPLIFIER_INPUTS.gm.unit, get: (s) => s.input.compensator.gm },
  { group: 'Compensator', key: 'comp.ro', label: amplifierInputLabel('ro'), kind: 'si', unit: AMPLIFIER_INPUTS.ro.unit, get: (s) => s.input.compensator.ro },
  { group: 'Compensator', key: 'comp.rb', label: `${PARTS.rb.name} as entered`, kind: 'si', unit: PARTS.rb.unit, get: (s) => s.input.compensator.rb },
  { group: 'Compensator', key: 'comp.a0', label: amplifierInputLabel('a0'), kind: 'si', unit: AMPLIFIER_INPUTS.a0.unit, get: (s) => s.input.compensator.opamp?.a0 },
  { group: 'Compensator', key: 'comp.gbw', label: amplifierInputLabel('gbw'), kind: 'si', unit: AMPLIFIER_INPUTS.gbw.unit, get: (s) => s.input.compensator.opamp?.gbw },
  ...COMP_PARTS.map<Spec>((p) => ({
    group: 'Compensator',
    key: `comp.${p}`,
    label: `${PARTS[p].name} as entered`,
    kind: 'si',
    unit: PARTS[p].unit,
    get: (s) => s.input.compensator[p],
  })),
  { group: 'Parts', key: 'resistorSeries', label: 'Resistor series', kind: 'text', get: (s) => s.summary.parts?.resistorSeries },
  { group: 'Parts', key: 'capacitorSeries', label: 'Capacitor series', kind: 'text', get: (s) => s.summary.parts?.capacitorSeries },
  ...PART_ORDER.map<Spec>((p) => ({
    group: 'Parts',
    key: `part.${p}`,
    label: p === 'rb' ? `${PARTS.rb.name} (divider, to ground)` : `${PARTS[p].name} standard value`,
    kind: 'si',
    unit: PARTS[p].unit,
    get: (s) => s.summary.parts?.snapped?.[p],
  })),
  { group: 'Margins', key: 'fc', label: 'Crossover fc', kind: 'si', unit: 'Hz', get: (s) => s.summary.margins?.crossoverHz },
  { group: 'Margins', key: 'pm', label: 'Phase margin PM', kind: 'deg', higherIsBetter: true, get: (s) => s.summary.margins?.phaseMarginDeg },
  { group: 'Margins', key: 'gm', label: 'Gain margin GM', kind: 'db', higherIsBetter: true, get: (s) => s.summary.margins?.gainMarginDb },
  { group: 'Margins', key: 'f180', label: 'Phase crossover (−180°)', kind: 'si', unit: 'Hz', get: (s) => s.summary.margins?.phaseCrossoverHz },
  { group: 'Margins', key: 'phaseHalfFsw', label: 'Loop phase at fsw/2', kind: 'deg', get: (s) => s.summary.phaseAtHalfFswDeg },
  { group: 'Margins', key: 'snapped.pm', label: 'PM with standard values', kind: 'deg', higherIsBetter: true, get: (s) => s.summary.parts?.snappedMargins?.phaseMarginDeg },
  { group: 'Margins', key: 'snapped.fc', label: 'fc with standard values', kind: 'si', unit: 'Hz', get: (s) => s.summary.parts?.snappedMargins?.crossoverHz },
  { group: 'Operating point', key: 'duty', label: 'Duty cycle D', kind: 'percent', get: (s) => s.summary.operatingPoint?.duty },
  { group: 'Operating point', key: 'conduction', label: 'Conduction mode', kind: 'text', get: (s) => s.summary.operatingPoint?.conduction },
  { group: 'Operating point', key: 'ripple', label: 'Inductor ripple (p-p)', kind: 'si', unit: 'A', get: (s) => s.summary.operatingPoint?.inductorRipplePp },
  { group: 'Operating point', key: 'vripple', label: 'Output ripple (p-p)', kind: 'si', unit: 'V', get: (s) => s.summary.operatingPoint?.outputRipplePp },
  { group: 'Checks', key: 'checks', label: 'Checks (risk / caution / note)', kind: 'text', get: (s) => checkCounts(s.summary) },
];


function checkCounts(s: RevisionSummary) {
  const list = s.checks ?? [];
  const n = (level: string) => list.filter((c) => c.level === level).length;
  return `${n('risk')} / ${n('caution')} / ${n('note')}`;
}

/** Equal within a relative 1e-9 (stored numbers round-trip through JSON; margins are computed). */
export function sameValue(a: number | string | null, b: number | string | null): boolean {
  if (a === b) return true;
  if (typeof a === 'number' && typeof b === 'number') return Math.abs(a - b) <= 1e-9 * Math.max(Math.abs(a), Math.abs(b));
  return false;
}

/** Every row of the difference table, in display order. */
export function diffRevisions(a: RevisionSide, b: RevisionSide): DiffRow[] {
  return SPECS.map(({ get, ...spec }) => {
    const va = get(a) ?? null;
    const vb = get(b) ?? null;
    return { ...spec, a: va, b: vb, changed: !sameValue(va, vb) };
  }).filter((r) => !(r.a === null && r.b === null)); // parts neither revision uses
}

export interface MarginDelta {
  key: 'fc' | 'pm' | 'gm';
  label: string;
  a: number | null;
  b: number | null;
  /** b − a, or null when either is missing. */
  delta: number | null;
}

/** The three margin figures with their change from a to b. */
export function marginDeltas(a: RevisionSide, b: RevisionSide): MarginDelta[] {
  const pick = (s: RevisionSide) => s.summary.margins ?? { crossoverHz: null, phaseMarginDeg: null, gainMarginDb: null };
  const ma = pick(a);
  const mb = pick(b);
  const d = (x: number | null, y: number | null) => (x === null || y === null ? null : y - x);
  return [
    { key: 'fc', label: 'Crossover fc', a: ma.crossoverHz, b: mb.crossoverHz, delta: d(ma.crossoverHz, mb.crossoverHz) },
    { key: 'pm', label: 'Phase margin', a: ma.phaseMarginDeg, b: mb.phaseMarginDeg, delta: d(ma.phaseMarginDeg, mb.phaseMarginDeg) },
    { key: 'gm', label: 'Gain margin', a: ma.gainMarginDb, b: mb.gainMarginDb, delta: d(ma.gainMarginDb, mb.gainMarginDb) },
  ];
}
