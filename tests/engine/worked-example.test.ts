/**
 * Worked example E1: Erickson & Maksimović, Fundamentals of Power Electronics, 2nd ed.,
 * §9.5.4 — voltage-mode buck with a lead (PD) and PI compensator (from memory; inputs
 * confirmed by a public script citing the book; see CHECK-VALUES §3). The book keeps the
 * sensor gain H = 1/3 inside the loop; with an op-amp compensator whose divider sits at a
 * virtual ground, H is folded into the compensator gain here (Vref 5 V sets H = 5/15).
 * Tolerances as in CHECK-VALUES: frequencies and Gc0 ±3 %, PM ±2°.
 */
import { describe, expect, it } from 'vitest';
import { analyze, preparePlant } from '@/lib/engine/analyze';
import { partsFromShape } from '@/lib/engine/compensator';
import { computeMargins } from '@/lib/engine/margins';
import { transferResponse } from '@/lib/engine/sweep';
import { multiplyTransfers, scaleTransfer, transferFromPolys } from '@/lib/engine/transfer';
import type { AnalyzeRequest } from '@/lib/engine/types';
import { expectAbs, expectRel } from './helpers';

const TWO_PI = 2 * Math.PI;
const H = 1 / 3;
const FC = 5e3;
const THETA = (52 * Math.PI) / 180;

const stage: Omit<AnalyzeRequest, 'compensator'> = {
  converter: { topology: 'buck', vin: 28, vout: 15, iout: 5, fsw: 100e3, l: 50e-6, rl: 0, c: 500e-6, rc: 0, vd: 0 },
  modulator: { vramp: 4 },
  feedback: { vref: 5 },
};

describe('E1: Erickson & Maksimović §9.5.4 buck, lead + PI (from memory)', () => {
  const prepared = preparePlant(stage);
  const f = prepared.grid.f as number[];
  const tu = scaleTransfer(prepared.plantTransfer, H);
  const tu0 = tu.gain;
  const f0 = prepared.plant.resonanceHz!;
  // Lead placement (book eq. for phase boost θ at fc) and the gain that makes |T(fc)| ≈ 1.
  const fz = FC * Math.sqrt((1 - Math.sin(THETA)) / (1 + Math.sin(THETA)));
  const fp = FC * Math.sqrt((1 + Math.sin(THETA)) / (1 - Math.sin(THETA)));
  const gc0 = ((FC / f0) ** 2 * Math.sqrt(fz / fp)) / tu0;

  it('plant landmarks: f0 ≈ 1 kHz, Q0 ≈ 9.5, Tu0 = 2.33', () => {
    expectRel(f0, 1006.6, 0.03, 'f0 (ours 1006.6 Hz; book ≈ 1 kHz)');
    expectRel(prepared.plant.q, 9.487, 0.03, 'Q0 (book ≈ 9.5, 19.5 dB)');
    expectRel(tu0, 2.3333, 0.03, 'Tu0 (book 2.33, 7.4 dB)');
  });

  it('uncompensated loop: fc ≈ 1.8 kHz, PM ≈ 5°', () => {
    const r = transferResponse(tu, f);
    const m = computeMargins(r.sampled, r.evaluate);
    expectRel(m.crossoverHz, 1840, 0.03, 'fc (book ≈ 1.8 kHz)');
    expectAbs(m.phaseMarginDeg, 4.7, 2, 'PM (book ≈ 5°)');
  });

  it('lead design: fz 1.7 kHz, fp 14.5 kHz, Gc0 3.7 (11.3 dB)', () => {
    expectRel(fz, 1700, 0.03, 'fz');
    expectRel(fp, 14500, 0.03, 'fp');
    expectRel(gc0, 3.7, 0.03, 'Gc0');
  });

  it('lead only: fc ≈ 5 kHz, PM ≈ 52°', () => {
    const lead = transferFromPolys([1, 1 / (TWO_PI * fz)], [1, 1 / (TWO_PI * fp)]);
    const r = transferResponse(multiplyTransfers(scaleTransfer(lead, gc0), tu), f);
    const m = computeMargins(r.sampled, r.evaluate);
    expectRel(m.crossoverHz, 5160, 0.03, 'fc');
    expectAbs(m.phaseMarginDeg, 53.2, 2, 'PM');
  });

  it('lead + PI zero at fc/10 as an op-amp Type III (C2 = 0), through analyze(): PM ≈ 47.7°', () => {
    const fL = FC / 10;
    const comp = partsFromShape({ type: 'type3', r1: 10e3, integratorHz: H * gc0 * fL, zerosHz: [fL, fz], polesHz: [fp] });
    const r = analyze({ ...stage, compensator: comp });
    expectAbs(r.margins.phaseMarginDeg, 47.7, 2, 'PM');
    expectRel(r.margins.crossoverHz, 5160, 0.03, 'fc');
    // The divider is the book's sensor: Rb = R1·Vref/(V − Vref) = R1/2, i.e. H = 1/3.
    expectRel(r.parts.ideal.rb, 5e3, 1e-12, 'Rb');
    // Compensator landmarks read back as placed.
    expectRel(r.compensator.zerosHz[0], fL, 1e-9);
    expectRel(r.compensator.zerosHz[1], fz, 1e-9);
    expect(r.compensator.polesHz).toHaveLength(2);
    expectRel(r.compensator.polesHz[1], fp, 1e-9);
  });
});
