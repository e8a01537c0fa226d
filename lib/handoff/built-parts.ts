/**
 * The circuit that will be built: the compensator with every part at its standard value
 * (the parts list's "Standard value" column). The netlist, the report's plot and margins and
 * the parts list all read these, so what is simulated is what is soldered; the ideal values
 * travel along as comments.
 */
import type { AnalyzeRequest, CompensatorInput, PartsResult, PartValues } from '@/lib/engine/types';

const opt = (v: number | null) => (v === null ? undefined : v);

/**
 * The compensator from standard part values (C2 = 0 or absent stays absent). The amplifier
 * (kind, gm, ro, op-amp model) is kept as entered. A gm stage's Rb is part of its loop and is
 * soldered like any other resistor, so it takes its standard value too, as the engine's
 * snapped margins assume (snapCompensator).
 */
export function builtCompensator(entered: CompensatorInput, snapped: PartValues): CompensatorInput {
  const { type, amplifier, gm, ro, rb, opamp } = entered;
  const comp: CompensatorInput = { type, r1: snapped.r1, c1: snapped.c1 };
  if (amplifier !== undefined) comp.amplifier = amplifier;
  if (gm !== undefined) comp.gm = gm;
  if (ro !== undefined) comp.ro = ro;
  if (rb !== undefined) comp.rb = amplifier === 'transconductance' ? (snapped.rb ?? rb) : rb;
  if (opamp !== undefined) comp.opamp = opamp;
  if (type !== 'type1') {
    comp.r2 = opt(snapped.r2);
    if (snapped.c2) comp.c2 = snapped.c2;
  }
  if (type === 'type3') {
    comp.r3 = opt(snapped.r3);
    comp.c3 = opt(snapped.c3);
  }
  return comp;
}

/** The request with the compensator as built (everything else as saved). */
export function builtRequest(input: AnalyzeRequest, parts: PartsResult): AnalyzeRequest {
  return { ...input, compensator: builtCompensator(input.compensator, parts.snapped) };
}

/** Whether every part already is a standard value (then ideal and built are one circuit). */
export function partsAreStandard(parts: PartsResult): boolean {
  return (Object.keys(parts.ideal) as (keyof PartValues)[]).every((k) => parts.ideal[k] === parts.snapped[k]);
}
