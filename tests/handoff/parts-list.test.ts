import { describe, expect, it } from 'vitest';
import { analyze } from '@/lib/engine/analyze';
import { SAMPLE_DESIGNS } from '@/lib/engine/samples';
import type { PartsResult } from '@/lib/engine/types';
import {
  buildPartsList,
  describePartRole,
  duplicateDesignators,
  PARTS_CSV_HEADER,
  partsListCsv,
  schematicValue,
} from '@/lib/handoff/parts-list';

/** An invented Type III result: ideal values from a K-factor placement, snapped to E96/E12. */
const PARTS: PartsResult = {
  resistorSeries: 'E96',
  capacitorSeries: 'E12',
  ideal: { r1: 10e3, r2: 28867.5, r3: 773.5, c1: 2.05759e-9, c2: 159.155e-12, c3: 5.51329e-9, rb: 2652.6 },
  snapped: { r1: 10e3, r2: 28.7e3, r3: 768, c1: 2.2e-9, c2: 150e-12, c3: 5.6e-9, rb: 2.67e3 },
  snappedMargins: { crossoverHz: null, phaseMarginDeg: null, gainMarginDb: null, phaseCrossoverHz: null, crossings: [] },
};

/** Minimal RFC 4180 reader for checking our own output. */
function readCsv(text: string): string[][] {
  const rows: string[][] = [];
  let row: string[] = [];
  let field = '';
  let quoted = false;
  for (let i = 0; i < text.length; i++) {
    const ch = text[i];
    if (quoted) {
      if (ch === '"' && text[i + 1] === '"') (field += '"'), i++;
      else if (ch === '"') quoted = false;
      else field += ch;
    } else if (ch === '"') quoted = true;
    else if (ch === ',') row.push(field), (field = '');
    else if (ch === '\r' && text[i + 1] === '\n') {
      row.push(field), rows.push(row), (row = []), (field = ''), i++;
    } else field += ch;
  }
  return rows;
}

describe('parts list', () => {
  it('lists every part of a Type III with default designators, roles, series and tolerance', () => {
    const rows = buildPartsList(PARTS, 'type3');
    expect(rows.map((r) => r.designator)).toEqual(['R1', 'R2', 'R3', 'C1', 'C2', 'C3', 'R4']);
    const r2 = rows.find((r) => r.part === 'r2')!;
    expect(r2.role).toBe('R2 — sets the mid-band gain; with C1 places the first zero');
    expect(r2.series).toBe('E96');
    expect(r2.tolerancePct).toBe(1); // E96 ↔ ±1 % (IEC 60063 convention)
    expect(rows.find((r) => r.part === 'c1')!.tolerancePct).toBe(10); // E12 ↔ ±10 %
    expect(rows.find((r) => r.part === 'rb')!.role).toMatch(/no effect on the loop gain/);
  });

  it('takes the schematic designators from the mapping', () => {
    const rows = buildPartsList(PARTS, 'type3', { r2: 'R17', c1: 'C42', rb: ' R18 ' });
    expect(rows.find((r) => r.part === 'r2')!.designator).toBe('R17');
    expect(rows.find((r) => r.part === 'c1')!.designator).toBe('C42');
    expect(rows.find((r) => r.part === 'rb')!.designator).toBe('R18');
    expect(rows.find((r) => r.part === 'r1')!.designator).toBe('R1');
    expect(duplicateDesignators(rows)).toEqual([]);
    expect(duplicateDesignators(buildPartsList(PARTS, 'type3', { r2: 'R1' }))).toEqual(['R1']);
  });

  it('leaves out parts a type does not use and an absent C2', () => {
    const t2: PartsResult = {
      ...PARTS,
      ideal: { ...PARTS.ideal, r3: null, c3: null, c2: 0 },
      snapped: { ...PARTS.snapped, r3: null, c3: null, c2: 0 },
    };
    expect(buildPartsList(t2, 'type2').map((r) => r.part)).toEqual(['r1', 'r2', 'c1', 'rb']);
    expect(describePartRole('c1', 'type1')).toMatch(/integrator capacitor/);
  });

  it('writes values as schematic tools read them', () => {
    expect(schematicValue(2670)).toBe('2.67k');
    expect(schematicValue(1.5e-9)).toBe('1.5n');
    expect(schematicValue(4.7e-6)).toBe('4.7u');
    expect(schematicValue(768)).toBe('768');
    expect(schematicValue(2652.6, 4)).toBe('2.653k');
  });

  it('writes RFC 4180 CSV that reads back to the same rows', () => {
    const rows = buildPartsList(PARTS, 'type3', { r2: 'R17' });
    const csv = partsListCsv(rows);
    expect(csv.endsWith('\r\n')).toBe(true);
    const table = readCsv(csv);
    expect(table[0]).toEqual([...PARTS_CSV_HEADER]);
    expect(table).toHaveLength(rows.length + 1);
    expect(table[2]).toEqual([
      'R17',
      'R2',
      'R2 — sets the mid-band gain; with C1 places the first zero',
      '28.87k',
      '28.7k',
      'ohm',
      'E96',
      '±1 %',
      '28700',
    ]);
    expect(table[4].slice(3, 9)).toEqual(['2.058n', '2.2n', 'F', 'E12', '±10 %', '2.2e-9']);
  });

  it('quotes a role or designator holding a comma or quote', () => {
    const rows = buildPartsList(PARTS, 'type3').slice(0, 1);
    rows[0].role = 'R1 — input, "top" resistor';
    expect(partsListCsv(rows).split('\r\n')[1]).toContain('"R1 — input, ""top"" resistor"');
  });

  it('matches the engine result of every sample design', () => {
    for (const s of SAMPLE_DESIGNS) {
      const result = analyze(s.request);
      const rows = buildPartsList(result.parts, s.request.compensator.type);
      for (const r of rows) {
        expect(result.parts.snapped[r.part]).toBe(r.standard);
        expect(result.parts.ideal[r.part]).toBe(r.ideal);
      }
      expect(rows.length).toBeGreaterThanOrEqual(4);
    }
  });
});
