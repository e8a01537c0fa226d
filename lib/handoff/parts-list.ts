/**
 * Parts list of a revision: one row per compensator part (and the lower divider resistor),
 * with the schematic's reference designator, the part's role in words, the ideal and the
 * standard value, the series and its tolerance. Written as CSV (RFC 4180: comma separated,
 * CRLF line ends, fields quoted when they hold a comma, quote or line break).
 *
 * Tolerance convention: the tolerance a series' step was designed for (IEC 60063) —
 * E6 ±20 %, E12 ±10 %, E24 ±5 %, E48 ±2 %, E96 ±1 %, E192 ±0.5 %. Order parts at least that
 * tight; a looser part can land nearer a neighbouring value than the one chosen.
 */
import { PART_ORDER, PARTS, type PartKey } from '@/lib/catalog/compensators';
import { SERIES_TOLERANCE } from '@/lib/engine/eseries';
import { E_SERIES_NAMES, type Amplifier, type CompensatorType, type ESeriesName, type PartsResult } from '@/lib/engine/types';
import { formatSi } from '@/lib/units/si';

export type { PartKey };

/** Percent tolerance of a series (IEC 60063's pairing, {@link SERIES_TOLERANCE}). */
const tolerancePctOf = (series: ESeriesName) => Math.round(SERIES_TOLERANCE[series] * 1000) / 10;
export const formatTolerance = (pct: number) => `±${pct} %`;

/** Parts-list order: resistors, then capacitors, then the divider. */
export const PART_KEYS: readonly PartKey[] = ['r1', 'r2', 'r3', 'c1', 'c2', 'c3', 'rb'];

/** The tolerance convention in words, from the series table. */
export const TOLERANCE_CONVENTION = `Tolerance is the one each IEC 60063 series was designed for: ${E_SERIES_NAMES
  .map((series) => `${series} ${formatTolerance(tolerancePctOf(series))}`)
  .join(', ')}.`;

/** Our name for each part in the compensator drawing, and the designator used when none is mapped. */
export const PART_NAME: Record<PartKey, string> = Object.fromEntries(PART_ORDER.map((k) => [k, PARTS[k].name])) as Record<PartKey, string>;
export const DEFAULT_DESIGNATOR: Record<PartKey, string> = { r1: 'R1', r2: 'R2', r3: 'R3', c1: 'C1', c2: 'C2', c3: 'C3', rb: 'R4' };

/** What the part does around a transconductance amplifier (the divider is in the loop). */
function describeGmPartRole(part: PartKey, name: string): string {
  switch (part) {
    case 'r1':
      return `${name} — divider top from the output to the feedback pin; with Rb sets the DC output and the loop's divider gain`;
    case 'r2':
      return `${name} — from the amplifier output (COMP) in series with C1 to ground; sets the mid-band gain with gm and places the zero`;
    case 'r3':
      return `${name} — in series with C3 across R1; places the feed-forward pole`;
    case 'c1':
      return `${name} — with R2 from COMP to ground; places the low-frequency zero (integrator capacitor)`;
    case 'c2':
      return `${name} — from COMP to ground; with R2 places the high-frequency pole`;
    case 'c3':
      return `${name} — across R1 with R3; places the feed-forward zero (phase boost)`;
    case 'rb':
      return `${name} — divider bottom; with R1 sets the DC output, and here it is part of the loop gain`;
  }
}

/** What the part does, in words, for the compensator type and amplifier. */
export function describePartRole(part: PartKey, type: CompensatorType, amplifier: Amplifier = 'opamp'): string {
  const name = PART_NAME[part];
  if (amplifier === 'transconductance') return describeGmPartRole(part, name);
  switch (part) {
    case 'r1':
      return type === 'type1'
        ? `${name} — input resistor from the output; with C1 sets the integrator gain and so the crossover`
        : `${name} — input resistor from the output; with C1 + C2 sets the integrator gain`;
    case 'r2':
      return `${name} — sets the mid-band gain; with C1 places the first zero`;
    case 'r3':
      return `${name} — with C3 places the high-frequency pole and sets the phase-boost gain`;
    case 'c1':
      return type === 'type1'
        ? `${name} — integrator capacitor; with R1 sets the crossover`
        : `${name} — with R2 places the low-frequency zero (integrator capacitor)`;
    case 'c2':
      return `${name} — with R2 places the high-frequency pole that rolls off switching ripple`;
    case 'c3':
      return `${name} — with R1 + R3 places the second zero (phase boost)`;
    case 'rb':
      return `${name} — lower divider resistor; with R1 sets the DC output (no effect on the loop gain)`;
  }
}

export interface PartRow {
  part: PartKey;
  designator: string;
  role: string;
  kind: 'resistor' | 'capacitor';
  /** Base units: Ω or F. */
  ideal: number;
  standard: number;
  series: ESeriesName;
  tolerancePct: number;
}

/**
 * Rows for the parts a revision uses (parts that are null, and C2 = 0, are left out).
 * `designators` maps part → the schematic's reference designator; unmapped parts get
 * {@link DEFAULT_DESIGNATOR}.
 */
export function buildPartsList(
  parts: PartsResult,
  type: CompensatorType,
  designators: Partial<Record<string, string>> = {},
  amplifier: Amplifier = 'opamp',
): PartRow[] {
  const rows: PartRow[] = [];
  for (const part of PART_KEYS) {
    const ideal = parts.ideal[part];
    const standard = parts.snapped[part];
    if (ideal === null || standard === null || !(ideal > 0)) continue;
    const kind = part.startsWith('r') ? 'resistor' : 'capacitor';
    const series = kind === 'resistor' ? parts.resistorSeries : parts.capacitorSeries;
    rows.push({
      part,
      designator: designators[part]?.trim() || DEFAULT_DESIGNATOR[part],
      role: describePartRole(part, type, amplifier),
      kind,
      ideal,
      standard,
      series,
      tolerancePct: tolerancePctOf(series),
    });
  }
  return rows;
}

/** Designators used by more than one row (a mapping mistake to show before export). */
export function duplicateDesignators(rows: readonly PartRow[]): string[] {
  const seen = new Map<string, number>();
  for (const r of rows) seen.set(r.designator.toUpperCase(), (seen.get(r.designator.toUpperCase()) ?? 0) + 1);
  return [...seen].filter(([, n]) => n > 1).map(([d]) => d);
}

/** A value as schematic and BOM tools write it: ASCII prefix, no space, no unit ("2.67k", "1.5n", "4.7u"). */
export function schematicValue(value: number, digits = 3): string {
  return formatSi(value, '', digits).replace(/\s+/g, '').replace('µ', 'u');
}


const unitOf = (r: PartRow) => (r.kind === 'resistor' ? 'ohm' : 'F');

export const PARTS_CSV_HEADER = [
  'Reference designator',
  'Part',
  'Role',
  'Ideal value',
  'Standard value',
  'Unit',
  'Series',
  'Tolerance',
  'Standard value (base unit)',
] as const;

function csvField(v: string): string {
  return /[",\r\n]/.test(v) ? `"${v.replace(/"/g, '""')}"` : v;
}

/** The parts list as CSV text (UTF-8, CRLF, header line first). */
export function partsListCsv(rows: readonly PartRow[]): string {
  const lines = [PARTS_CSV_HEADER.join(',')];
  for (const r of rows) {
    lines.push(
      [
        r.designator,
        PART_NAME[r.part],
        r.role,
        schematicValue(r.ideal, 4),
        schematicValue(r.standard),
        unitOf(r),
        r.series,
        formatTolerance(r.tolerancePct),
        String(Number(r.standard.toPrecision(6))),
      ]
        .map(csvField)
        .join(','),
    );
  }
  return lines.join('\r\n') + '\r\n';
}
