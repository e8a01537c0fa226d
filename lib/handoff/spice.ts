/**
 * The .cir export: the engine's netlist (lib/engine/spice-netlist.ts: averaged power stage at
 * the operating point, op-amp compensator, .ac card) with a title naming the design and
 * revision, ready for `ngspice -b <file>.cir` without edits.
 *
 * The compensator and the divider use the standard values of the parts list (what will be
 * built), each with its ideal value in a comment, so the simulated circuit is the soldered one.
 */
import { buildSpiceNetlist } from '@/lib/engine/spice-netlist';
import { COMPENSATORS, compensatorTitle, landmarksSetBy, partRole, PARTS } from '@/lib/catalog/compensators';
import type { Amplifier, AnalyzeRequest, CompensatorType, PartsResult, PartValues } from '@/lib/engine/types';
import { builtRequest } from './built-parts';
import { PART_KEYS, PART_NAME } from './parts-list';

/** The compensator named from the catalogue: its type, each part's place and what it sets. */
function compensatorComments(type: CompensatorType, amplifier: Amplifier | undefined): string[] {
  return [
    `* Compensator: ${compensatorTitle(type)}`,
    ...COMPENSATORS[type].parts.map((p) => {
      const sets = landmarksSetBy(type, p, amplifier);
      return `*   ${PARTS[p].name}: ${partRole(type, p, amplifier)}${sets.length ? `; sets ${sets.join(', ')}` : ''}`;
    }),
  ].map((line) => line.replace(/[^\x20-\x7e]/g, (c) => (c === '·' ? '*' : c === '–' ? '-' : c === '∥' ? '||' : '?')));
}

/** A value as SPICE reads it (the netlist writes the same 12 significant digits). */
const v = (x: number): string => String(Number(x.toPrecision(12)));

function partComments(parts: PartsResult): string[] {
  const lines = [`* Parts at their standard values (${parts.resistorSeries} resistors, ${parts.capacitorSeries} capacitors), as in the parts list:`];
  for (const k of PART_KEYS) {
    const built = parts.snapped[k as keyof PartValues];
    const ideal = parts.ideal[k as keyof PartValues];
    if (built === null || ideal === null || !(built > 0)) continue;
    lines.push(`*   ${PART_NAME[k]} = ${v(built)}  (ideal ${v(ideal)})`);
  }
  return lines;
}

/** The output voltage the standard divider sets (sign as entered), or null without Rb. */
export function builtOutputVoltage(input: AnalyzeRequest, parts: PartsResult): number | null {
  const { r1, rb } = parts.snapped;
  if (!rb) return null;
  return Math.sign(input.converter.vout) * input.feedback.vref * (1 + r1 / rb);
}

function voutComment(input: AnalyzeRequest, parts: PartsResult): string[] {
  const vout = builtOutputVoltage(input, parts);
  return vout === null ? [] : [`*   With the standard R1 and Rb the output sets to ${v(Number(vout.toPrecision(5)))} V (entered ${v(input.converter.vout)} V).`];
}

export function spiceNetlistFile(args: { designName: string; revision: number; input: AnalyzeRequest; parts: PartsResult }): string {
  // The title line is the first line SPICE reads; keep it to one printable line.
  const name = args.designName.replace(/[\r\n]+/g, ' ').replace(/[^\x20-\x7e]/g, '-');
  const built = builtRequest(args.input, args.parts);
  const netlist = buildSpiceNetlist(built, {
    title: `Phasewright ${name} r${args.revision}: loop gain check`,
    rb: args.parts.snapped.rb ?? undefined,
  });
  // The engine's control block ends with `quit`, so `ngspice -b` exits 0 when done.
  const [title, ...rest] = netlist.split('\n');
  return [
    title,
    '* Small-signal averaged model at one operating point: an estimate. Verify the loop on the bench.',
    '* Run: ngspice -b <this file>   (prints V(duty), then frequency, loopdb, loopdeg)',
    ...compensatorComments(args.input.compensator.type, args.input.compensator.amplifier),
    ...partComments(args.parts),
    ...voutComment(args.input, args.parts),
    ...rest,
  ].join('\n');
}
