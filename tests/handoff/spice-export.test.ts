import { describe, expect, it } from 'vitest';
import { analyze } from '@/lib/engine/analyze';
import { interpolateLogF } from '@/lib/engine/margins';
import { MODE_SAMPLES, SAMPLE_DESIGNS } from '@/lib/engine/samples';
import type { AnalyzeRequest } from '@/lib/engine/types';
import { builtRequest } from '@/lib/handoff/built-parts';
import { buildExport } from '@/lib/handoff/exports';
import { builtOutputVoltage } from '@/lib/handoff/spice';
import { buildPartsList, partsListCsv } from '@/lib/handoff/parts-list';
import { ngspiceAvailable, readNgspiceTable, runNgspice } from '../support/ngspice';

/**
 * The exported .cir, run as it is by Debian's ngspice, against the engine with the parts as
 * built (standard values): loop gain within 0.1 dB and 1° at every ngspice frequency (engine
 * swept densely and interpolated in log f).
 */
const haveNgspice = ngspiceAvailable();

function exportCir(request: AnalyzeRequest, name: string) {
  return buildExport('spice', {
    design: { name, description: '', topology: request.converter.topology, designatorMap: {} },
    revision: { number: 2, note: '', createdAt: new Date(), authorName: 'x', input: request },
    signoff: { state: 'draft', at: null, by: null },
    result: analyze(request),
    teamName: 't',
  });
}

describe.skipIf(!haveNgspice)('exported SPICE netlist agrees with the engine (ngspice)', () => {
  for (const sample of [...SAMPLE_DESIGNS, ...MODE_SAMPLES]) {
    it(sample.key, () => {
      const file = exportCir(sample.request, sample.name);
      expect(file.fileName).toMatch(/-r2\.cir$/);
      expect(file.body.split('\n')[0]).toMatch(/^\* Phasewright .* r2: loop gain check$/);
      const out = runNgspice(file.body, file.fileName);
      const rows = readNgspiceTable(out, ['frequency', 'loopdb', 'loopdeg']);
      expect(rows.length).toBeGreaterThan(50);
      const fStop = sample.request.converter.fsw / 2;
      const parts = analyze(sample.request).parts;
      const built = builtRequest(sample.request, parts);
      // The standard divider moves the output a little; the simulator finds that operating point.
      built.converter = { ...built.converter, vout: builtOutputVoltage(sample.request, parts)! };
      const dense = analyze({ ...built, sweep: { fStart: 10, fStop, points: 8000 } }).bode;
      let worstDb = 0;
      let worstDeg = 0;
      for (const [f, db, deg] of rows) {
        const mdb = interpolateLogF(dense.f, dense.loop.magDb, f);
        const mdeg = interpolateLogF(dense.f, dense.loop.phaseDeg, f);
        worstDb = Math.max(worstDb, Math.abs(db - mdb));
        // ngspice's cph is continuous from its own start; compare modulo 360°.
        const d = ((((deg - mdeg) % 360) + 540) % 360) - 180;
        worstDeg = Math.max(worstDeg, Math.abs(d));
      }
      expect(worstDb).toBeLessThan(0.1);
      expect(worstDeg).toBeLessThan(1);
    });
  }
});

/** The part lines of a netlist: name → value (SPICE reads a plain number or exponent form). */
function netlistParts(cir: string): Map<string, number> {
  const out = new Map<string, number>();
  for (const line of cir.split('\n')) {
    const m = /^(R1|R2|R3|C1|C2|C3|Rb) \S+ \S+ (\S+)$/.exec(line);
    if (m) out.set(m[1], Number(m[2]));
  }
  return out;
}

describe('the netlist builds the parts of the parts list', () => {
  // The mode samples add a gm stage, whose Rb is in the loop (4444.44 Ω entered, 4.42 kΩ built).
  for (const sample of [...SAMPLE_DESIGNS, ...MODE_SAMPLES]) {
    it(`${sample.key}: every R and C in the netlist equals the parts list's standard value`, () => {
      const result = analyze(sample.request);
      const cir = exportCir(sample.request, sample.name).body;
      const rows = buildPartsList(result.parts, sample.request.compensator.type);
      const inNetlist = netlistParts(cir);
      // Rb appears in the netlist under its drawing name; the parts list names it R4 by default.
      const names = rows.map((r) => (r.part === 'rb' ? 'Rb' : r.designator)).sort();
      expect([...inNetlist.keys()].sort()).toEqual(names);
      // The CSV's base-unit column is what a BOM tool reads: compare with that too.
      const csv = partsListCsv(rows).trim().split('\r\n').slice(1).map((l) => Number(l.split(',').at(-1)));
      rows.forEach((r, i) => {
        const name = r.part === 'rb' ? 'Rb' : r.designator;
        expect(inNetlist.get(name)).toBeCloseTo(r.standard, 12);
        expect(inNetlist.get(name)! / csv[i]).toBeCloseTo(1, 5);
      });
      // The built circuit is the one whose margins the engine reports for the standard parts.
      const built = analyze(builtRequest(sample.request, result.parts)).margins;
      expect(built.phaseMarginDeg).toBeCloseTo(result.parts.snappedMargins.phaseMarginDeg!, 9);
      expect(built.crossoverHz).toBeCloseTo(result.parts.snappedMargins.crossoverHz!, 6);
      // The ideal values stay as comments, and the netlist says it uses the standard ones.
      expect(cir).toMatch(/^\* Parts at their standard values/m);
      for (const r of rows) expect(cir).toMatch(new RegExp(`^\\*   ${r.part === 'rb' ? 'Rb' : r.part.toUpperCase()} = \\S+  \\(ideal `, 'm'));
    });
  }
});
