import { describe, expect, it } from 'vitest';
import { analyze } from '@/lib/engine/analyze';
import { interpolateLogF } from '@/lib/engine/margins';
import { SAMPLE_DESIGNS } from '@/lib/engine/samples';
import type { AnalyzeRequest } from '@/lib/engine/types';
import { buildExport } from '@/lib/handoff/exports';
import { ngspiceAvailable, readNgspiceTable, runNgspice } from '../support/ngspice';

/**
 * The exported .cir, run as it is by Debian's ngspice, against the engine: loop gain within
 * 0.1 dB and 1° at every ngspice frequency (engine swept densely and interpolated in log f).
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
  for (const sample of SAMPLE_DESIGNS) {
    it(sample.key, () => {
      const file = exportCir(sample.request, sample.name);
      expect(file.fileName).toMatch(/-r2\.cir$/);
      expect(file.body.split('\n')[0]).toMatch(/^\* Phasewright .* r2: loop gain check$/);
      const out = runNgspice(file.body, file.fileName);
      const rows = readNgspiceTable(out, ['frequency', 'loopdb', 'loopdeg']);
      expect(rows.length).toBeGreaterThan(50);
      const fStop = sample.request.converter.fsw / 2;
      const dense = analyze({ ...sample.request, sweep: { fStart: 10, fStop, points: 8000 } }).bode;
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
