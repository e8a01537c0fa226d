/**
 * The .cir export: the engine's netlist (lib/engine/spice-netlist.ts: averaged power stage at
 * the operating point, op-amp compensator, .ac card) with a title naming the design and
 * revision, ready for `ngspice -b <file>.cir` without edits.
 */
import { buildSpiceNetlist } from '@/lib/engine/spice-netlist';
import { COMPENSATORS, compensatorTitle, landmarksSetBy, partRole, PARTS } from '@/lib/catalog/compensators';
import type { AnalyzeRequest, CompensatorType } from '@/lib/engine/types';

/** The compensator named from the catalogue: its type, each part's place and what it sets. */
function compensatorComments(type: CompensatorType): string[] {
  return [
    `* Compensator: ${compensatorTitle(type)}`,
    ...COMPENSATORS[type].parts.map((p) => {
      const sets = landmarksSetBy(type, p);
      return `*   ${PARTS[p].name}: ${partRole(type, p)}${sets.length ? `; sets ${sets.join(', ')}` : ''}`;
    }),
  ].map((line) => line.replace(/[^\x20-\x7e]/g, (c) => (c === '·' ? '*' : c === '–' ? '-' : '?')));
}

export function spiceNetlistFile(args: { designName: string; revision: number; input: AnalyzeRequest }): string {
  // The title line is the first line SPICE reads; keep it to one printable line.
  const name = args.designName.replace(/[\r\n]+/g, ' ').replace(/[^\x20-\x7e]/g, '-');
  const netlist = buildSpiceNetlist(args.input, { title: `Phasewright ${name} r${args.revision}: loop gain check` });
  // The engine's control block ends with `quit`, so `ngspice -b` exits 0 when done.
  const [title, ...rest] = netlist.split('\n');
  return [
    title,
    '* Small-signal averaged model at one operating point: an estimate. Verify the loop on the bench.',
    '* Run: ngspice -b <this file>   (prints V(duty), then frequency, loopdb, loopdeg)',
    ...compensatorComments(args.input.compensator.type),
    ...rest,
  ].join('\n');
}
