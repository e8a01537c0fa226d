/**
 * Control modes and error amplifiers against published results:
 * - peak current mode: Ridley, "A new, continuous-time model for current-mode control",
 *   IEEE Trans. Power Electronics 6(2), 1991 (Qp, mc, the simplified buck Gvc);
 * - transconductance amplifier: Gc = gm·H·Zo evaluated directly from the circuit (complex
 *   arithmetic, no sections), Type II landmarks zero 1/(2πR2C1), pole (C1+C2)/(2πR2C1C2);
 * - finite op-amp: the inverting stage with finite gain, Sedra & Smith, Microelectronic
 *   Circuits, ch. 2, evaluated directly;
 * - DCM: Erickson & Maksimović, Fundamentals of Power Electronics, 2nd ed., ch. 15, the
 *   table of DCM control-to-output gains and poles (from memory) and the conversion ratios
 *   of ch. 5 (M as a function of D and K = 2L/(R·Ts)).
 */
import Complex from 'complex.js';
import { describe, expect, it } from 'vitest';
import { analyze, preparePlant } from '@/lib/engine/analyze';
import { proposeForPlant } from '@/lib/engine/starting-point';
import { compensatorImpedances, compensatorTransfer, opAmpShapeError, partsFromShape, shapeFromParts, summarizeCompensator } from '@/lib/engine/compensator';
import { peakCurrentParameters } from '@/lib/engine/control';
import { sampleByKey } from '@/lib/engine/samples';
import { computeOperatingPoint } from '@/lib/engine/steady-state';
import { evaluateTransfer } from '@/lib/engine/transfer';
import { EngineInputError, type AnalyzeRequest, type CompensatorInput, type ConverterInput } from '@/lib/engine/types';
import { expectAbs, expectRel } from './helpers';

const TWO_PI = 2 * Math.PI;
const qp = (mc: number, d: number) => 1 / (Math.PI * (mc * (1 - d) - 0.5));

const lossless = (over: Partial<ConverterInput>): ConverterInput => ({
  topology: 'buck',
  vin: 12,
  vout: 5,
  iout: 2,
  fsw: 200e3,
  l: 10e-6,
  rl: 0,
  c: 100e-6,
  rc: 0,
  vd: 0,
  ...over,
});

const cm = (converter: ConverterInput, ri: number, se: number): AnalyzeRequest => ({
  converter,
  modulator: { mode: 'peak-current', ri, se },
  feedback: { vref: 1 },
  compensator: { type: 'type2', r1: 10e3, r2: 10e3, c1: 10e-9, c2: 100e-12 },
});

describe('peak current mode (Ridley 1991)', () => {
  it('Qp = 1/(π(mc·D′ − 0.5)): the formula at published-style vectors', () => {
    // Direct evaluations of Ridley's expression.
    expectRel(qp(2, 0.5), 0.63662, 1e-5, 'mc 2, D 0.5');
    expectRel(qp(1.5, 0.4), 0.79577, 1e-5, 'mc 1.5, D 0.4');
    // Qp = 1 at mc·D' = 0.5 + 1/π = 0.81831 (Ridley 1991).
    expectRel(0.5 + 1 / Math.PI, 0.81831, 1e-5, 'mc·D′ at Qp = 1');
  });

  it('the engine reports Ridley’s quantities and the external ramp for Qp = 1 and for stability', () => {
    const cv = lossless({ vin: 12, vout: 8 }); // D = 2/3
    const op = computeOperatingPoint(cv);
    const ri = 0.1;
    const p = peakCurrentParameters(cv, op, ri, 0);
    expectRel(p.sn, (ri * (12 - 8)) / 10e-6, 1e-12, 'Sn = Ri(Vg − V)/L');
    expectRel(p.sf, (ri * 8) / 10e-6, 1e-9, 'Sf = Ri·V/L');
    expectRel(p.seMinStable, (p.sf - p.sn) / 2, 1e-12, 'Se > (Sf − Sn)/2');
    // At Se = seForQp1, Qp is 1.
    const q1 = peakCurrentParameters(cv, op, ri, p.seForQp1);
    expectRel(q1.qp!, 1, 1e-9, 'Qp at the reported ramp');
    const r = analyze(cm(cv, ri, p.seForQp1));
    expect(r.modulator.mode).toBe('peak-current');
    if (r.modulator.mode === 'peak-current') expectRel(r.modulator.qp!, 1, 1e-9);
  });

  it('without an external ramp the current loop is unstable above D = 0.5 (common practice) and not below', () => {
    const above = analyze(cm(lossless({ vin: 12, vout: 8 }), 0.1, 0));
    expect(above.checks.find((c) => c.id === 'subharmonic')?.level).toBe('risk');
    // The sampling pair has moved into the right half plane: the plant has a RHP pole pair.
    const below = analyze(cm(lossless({ vin: 12, vout: 5 }), 0.1, 0));
    expect(below.checks.find((c) => c.id === 'subharmonic')?.level).not.toBe('risk');
    // Enough ramp makes D = 2/3 stable.
    const p = peakCurrentParameters(lossless({ vin: 12, vout: 8 }), computeOperatingPoint(lossless({ vin: 12, vout: 8 })), 0.1, 0);
    const fixed = analyze(cm(lossless({ vin: 12, vout: 8 }), 0.1, p.seMinStable * 1.5));
    expect(fixed.checks.some((c) => c.id === 'subharmonic' && c.level === 'risk')).toBe(false);
  });

  it('a lightly damped pair (Qp > 2) is a caution', () => {
    const r = analyze(cm(lossless({ vin: 12, vout: 5 }), 0.1, 0)); // D 0.417, Qp ≈ 3.8
    expect(r.checks.find((c) => c.id === 'subharmonic')?.level).toBe('caution');
  });

  it('buck Gvc matches Ridley’s simplified expression: DC gain, load pole, double pole at fsw/2 with Qp', () => {
    const cv = lossless({});
    const ri = 0.1;
    // The simplified form assumes the load pole well below fsw/2 (Qp not far below 1).
    for (const se of [0, 2e4, 5e4]) {
      const prepared = preparePlant(cm(cv, ri, se));
      const m = prepared.modulator;
      if (m.mode !== 'peak-current') throw new Error('mode');
      const r = prepared.operatingPoint.loadResistance;
      const ts = 1 / cv.fsw;
      const x = m.mc * (1 - prepared.operatingPoint.duty) - 0.5;
      // Gvc ≈ (R/Ri)/(1 + R·Ts(mc·D′ − 0.5)/L) · 1/(1 + s/ωp) · 1/(1 + s/(ωn·Qp) + s²/ωn²)
      const dc = r / ri / (1 + (r * ts * x) / cv.l);
      const wp = 1 / (cv.c * r) + (ts * x) / (cv.l * cv.c);
      expectAbs(prepared.plant.dcGainDb, 20 * Math.log10(dc), 1e-9, `DC gain, Se ${se}`);
      expectRel(prepared.plant.polesHz[0], wp / TWO_PI, 0.02, `load pole, Se ${se}`);
      if (m.qp! > 0.5) {
        expectRel(prepared.plant.resonanceHz, cv.fsw / 2, 0.01, `double pole at fsw/2, Se ${se}`);
        expectRel(prepared.plant.q, m.qp!, 0.03, `its Q, Se ${se}`);
      }
    }
  });

  it('boost in current mode keeps the RHP zero of the power stage', () => {
    const cv = lossless({ topology: 'boost', vin: 5, vout: 12, iout: 0.5, l: 10e-6, c: 47e-6 });
    const vmode = preparePlant({ ...cm(cv, 0.1, 3e4), modulator: { vramp: 1 } });
    const cmode = preparePlant(cm(cv, 0.1, 3e4));
    expectRel(cmode.plant.rhpZeroHz, vmode.plant.rhpZeroHz!, 1e-9, 'RHP zero');
    // Boost RHP zero R·D′²/(2πL) (Erickson & Maksimović 2nd ed. ch. 8).
    const dp = 5 / 12;
    expectRel(cmode.plant.rhpZeroHz, (24 * dp * dp) / (TWO_PI * 10e-6), 1e-9, 'R·D′²/L');
  });
});

describe('transconductance error amplifier', () => {
  const gmII: CompensatorInput = { type: 'type2', amplifier: 'transconductance', gm: 1e-3, ro: 5e6, rb: 10e3, r1: 40e3, r2: 15e3, c1: 10e-9, c2: 47e-12 };
  const gmIII: CompensatorInput = { ...gmII, type: 'type3', r3: 2e3, c3: 1e-9 };

  /** gm·H(s)·Zo(s) straight from the circuit. */
  const direct = (c: CompensatorInput, hz: number) => {
    const s = new Complex(0, TWO_PI * hz);
    const cap = (x: number) => new Complex(1, 0).div(s.mul(x));
    const par = (a: Complex, b: Complex) => a.mul(b).div(a.add(b));
    let top: Complex = new Complex(c.r1, 0);
    if (c.type === 'type3') top = par(top, cap(c.c3!).add(c.r3!));
    const h = new Complex(c.rb!, 0).div(top.add(c.rb!));
    let zo = cap(c.c1).add(c.r2!);
    if (c.c2) zo = par(zo, cap(c.c2));
    if (c.ro) zo = par(zo, new Complex(c.ro, 0));
    return h.mul(zo).mul(c.gm!);
  };

  it.each([
    ['Type II', gmII],
    ['Type III', gmIII],
    ['Type II, ro infinite', { ...gmII, ro: undefined }],
  ])('%s: Gc = gm·H·Zo to machine precision', (_, c) => {
    const gc = compensatorTransfer(c);
    for (const hz of [1, 30, 1e3, 3e4, 1e6]) {
      const a = evaluateTransfer(gc, new Complex(0, TWO_PI * hz));
      const b = direct(c, hz);
      expect(a.sub(b).abs() / b.abs(), `${hz} Hz`).toBeLessThan(1e-9);
    }
  });

  it('Type II landmarks: zero 1/(2πR2C1), pole (C1+C2)/(2πR2C1C2), mid-band gm·H0·R2·C1/(C1+C2)', () => {
    const s = summarizeCompensator(gmII);
    expect(s.amplifier).toBe('transconductance');
    expectRel(s.zerosHz[0], 1 / (TWO_PI * 15e3 * 10e-9), 1e-12);
    expectRel(s.polesHz[1], (10e-9 + 47e-12) / (TWO_PI * 15e3 * 10e-9 * 47e-12), 1e-12);
    expectAbs(s.midbandGainDb, 20 * Math.log10((1e-3 * 0.2 * 15e3 * 10e-9) / (10e-9 + 47e-12)), 1e-9);
    // ro moves the origin pole to 1/(2π·ro·(C1+C2)).
    expectRel(s.polesHz[0], 1 / (TWO_PI * 5e6 * (10e-9 + 47e-12)), 1e-12);
  });

  it('parts ↔ shape round trip keeps gm, ro, Rb and the parts', () => {
    for (const c of [gmII, gmIII]) {
      const back = partsFromShape(shapeFromParts(c));
      expect(back.amplifier).toBe('transconductance');
      expect(back.gm).toBe(c.gm);
      expect(back.rb).toBe(c.rb);
      for (const k of ['r2', 'r3', 'c1', 'c2', 'c3'] as const) if (c[k] !== undefined) expectRel(back[k], c[k]!, 1e-9, k);
    }
  });

  it('Type III: the R3·C3 pole cannot sit more than (R1+Rb)/Rb above its zero', () => {
    const shape = shapeFromParts(gmIII);
    const tooWide = { ...shape, polesHz: [shape.polesHz[0], shape.zerosHz[1] * 6] }; // (40k + 10k)/10k = 5
    expect(() => partsFromShape(tooWide)).toThrow(EngineInputError);
    try {
      partsFromShape(tooWide);
    } catch (e) {
      expect((e as EngineInputError).issues[0].path).toBe('shape.polesHz.1');
    }
  });

  it('is refused for Type I and without gm or Rb, naming the field', () => {
    const base: AnalyzeRequest = { ...cm(lossless({}), 0.1, 0), compensator: gmII };
    const paths = (c: CompensatorInput) => {
      try {
        analyze({ ...base, compensator: c });
        return [];
      } catch (e) {
        return (e as EngineInputError).issues.map((i) => i.path);
      }
    };
    expect(paths({ type: 'type1', amplifier: 'transconductance', gm: 1e-3, rb: 1e4, r1: 1e4, c1: 1e-9 })).toContain('compensator.amplifier');
    expect(paths({ ...gmII, gm: undefined })).toContain('compensator.gm');
    expect(paths({ ...gmII, rb: 0 })).toContain('compensator.rb');
  });

  it('a divider that does not set vout from vref is a caution', () => {
    const r = analyze({ ...cm(lossless({}), 0.1, 0), compensator: { ...gmII, rb: 20e3 } }); // 5 V·20k/60k ≠ 1 V
    expect(r.checks.find((c) => c.id === 'divider-setpoint')?.level).toBe('caution');
    const ok = analyze({ ...cm(lossless({}), 0.1, 0), compensator: gmII }); // 5 V·10k/50k = 1 V
    expect(ok.checks.some((c) => c.id === 'divider-setpoint')).toBe(false);
  });
});

describe('finite op-amp (Sedra & Smith, ch. 2)', () => {
  const comp: CompensatorInput = { type: 'type3', r1: 10e3, r2: 20e3, r3: 500, c1: 4.7e-9, c2: 47e-12, c3: 2.2e-9 };

  it('A·Zf/((1 + A)·Zi + Zf) with A = a0/(1 + s·a0/ωGBW), evaluated directly', () => {
    const real = { ...comp, opamp: { a0: 1e4, gbw: 1e6 } };
    const gc = compensatorTransfer(real);
    for (const hz of [10, 1e3, 1e4, 1e5, 1e6]) {
      const s = new Complex(0, TWO_PI * hz);
      const { zi, zf } = compensatorImpedances(comp, s);
      const a = new Complex(1e4, 0).div(new Complex(1, 0).add(s.mul(1e4 / (TWO_PI * 1e6))));
      const ref = a.mul(zf).div(a.add(1).mul(zi).add(zf));
      expect(evaluateTransfer(gc, s).sub(ref).abs() / ref.abs(), `${hz} Hz`).toBeLessThan(1e-9);
    }
  });

  it('tends to the ideal stage as a0 and GBW grow', () => {
    const ideal = compensatorTransfer(comp);
    const fast = compensatorTransfer({ ...comp, opamp: { a0: 1e9, gbw: 1e12 } });
    for (const hz of [100, 1e4, 1e5]) {
      const s = new Complex(0, TWO_PI * hz);
      const a = evaluateTransfer(fast, s);
      const b = evaluateTransfer(ideal, s);
      expect(a.sub(b).abs() / b.abs()).toBeLessThan(1e-3);
    }
  });

  it('the shape error 1/(1 + NG/A) equals the realised stage over the ideal one, Rb loading included (Sedra & Smith, ch. 2)', () => {
    const loaded: CompensatorInput = { ...comp, rb: 3.2e3, opamp: { a0: 2e4, gbw: 2e6 } };
    const freqs = [300, 5e3, 4e4, 2e5];
    const e = opAmpShapeError(loaded, freqs);
    let worstDb = 0;
    let worstDeg = 0;
    for (const hz of freqs) {
      const s = new Complex(0, TWO_PI * hz);
      const ratio = evaluateTransfer(compensatorTransfer(loaded), s).div(evaluateTransfer(compensatorTransfer({ ...loaded, opamp: undefined }), s));
      worstDb = Math.max(worstDb, Math.abs(20 * Math.log10(ratio.abs())));
      worstDeg = Math.max(worstDeg, Math.abs((ratio.arg() * 180) / Math.PI));
    }
    expect(worstDb).toBeGreaterThan(0.1);
    expectRel(e.worstDb, worstDb, 1e-9);
    expectRel(e.worstDeg, worstDeg, 1e-9);
  });

  it('a slow op-amp is a caution naming a GBW that is enough; a fast one is not', () => {
    const req = (gbw: number): AnalyzeRequest => ({
      converter: { topology: 'buck', vin: 12, vout: 3.3, iout: 2, fsw: 500e3, l: 4.7e-6, rl: 0.02, c: 100e-6, rc: 0.005, vd: 0 },
      modulator: { vramp: 1 },
      feedback: { vref: 0.8 },
      compensator: { type: 'type3', r1: 10e3, r2: 4.7e3, r3: 500, c1: 10e-9, c2: 220e-12, c3: 4.7e-9, opamp: { a0: 1e5, gbw } },
    });
    const slow = analyze(req(1e6));
    const c = slow.checks.find((x) => x.id === 'opamp-bandwidth');
    expect(c?.level).toBe('caution');
    expect(c?.message).toMatch(/GBW of about/);
    expect(analyze(req(1e9)).checks.some((x) => x.id === 'opamp-bandwidth')).toBe(false);
  });
});

describe('discontinuous conduction (Erickson & Maksimović 2nd ed. ch. 15)', () => {
  // Lossless stages at light load; K = 2L/(R·Ts).
  const cases: [string, ConverterInput, (m: number, d: number, v: number, r: number, c: number) => { gd0: number; wp: number }][] = [
    [
      'buck',
      lossless({ topology: 'buck', vin: 12, vout: 5, iout: 0.05, l: 4.7e-6 }),
      (m, d, v, r, c) => ({ gd0: ((2 * v) / d) * ((1 - m) / (2 - m)), wp: (2 - m) / ((1 - m) * r * c) }),
    ],
    [
      'boost',
      lossless({ topology: 'boost', vin: 5, vout: 12, iout: 0.02, l: 4.7e-6 }),
      (m, d, v, r, c) => ({ gd0: ((2 * v) / d) * ((m - 1) / (2 * m - 1)), wp: (2 * m - 1) / ((m - 1) * r * c) }),
    ],
    ['buck-boost', lossless({ topology: 'buck-boost', vin: 12, vout: 5, iout: 0.02, l: 4.7e-6 }), (_m, d, v, r, c) => ({ gd0: v / d, wp: 2 / (r * c) })],
  ];

  it.each(cases)('%s: duty from the DCM steady state, Gd0 and ωp from the ch. 15 table', (name, cv, table) => {
    const r = analyze({ converter: cv, modulator: { vramp: 1 }, feedback: { vref: 1 }, compensator: { type: 'type2', r1: 10e3, r2: 10e3, c1: 10e-9, c2: 100e-12 } });
    const op = r.operatingPoint;
    expect(op.conduction).toBe('DCM');
    const R = cv.vout / cv.iout;
    const k = (2 * cv.l * cv.fsw) / R;
    const d = op.duty;
    const m = cv.vout / cv.vin;
    // Conversion ratio in DCM (Erickson & Maksimović 2nd ed. ch. 5).
    const mOfD = name === 'buck' ? 2 / (1 + Math.sqrt(1 + (4 * k) / (d * d))) : name === 'boost' ? (1 + Math.sqrt(1 + (4 * d * d) / k)) / 2 : d / Math.sqrt(k);
    expectRel(mOfD, m, 1e-9, 'M(D, K)');
    const t = table(m, d, cv.vout, R, cv.c);
    expectAbs(r.plant.dcGainDb, 20 * Math.log10(t.gd0), 1e-6, 'Gd0 (Vramp 1)');
    expectRel(r.dcmPoleHz, t.wp / TWO_PI, 1e-6, 'ωp');
    expect(r.checks.find((c) => c.id === 'dcm-model')?.level).toBe('note');
    // The LC double pole is gone: no resonance in the plant.
    expect(r.plant.resonanceHz).toBeNull();
  });

  it('at the boundary the duty is continuous and each model is continuous in load (the jump is the models’ own difference)', () => {
    const base = lossless({ topology: 'boost', vin: 5, vout: 12, l: 10e-6 });
    const crit = computeOperatingPoint({ ...base, iout: 1 }).criticalLoadCurrent * (1 / 1); // critical current at the CCM duty
    const req = (iout: number): AnalyzeRequest => ({ converter: { ...base, iout }, modulator: { vramp: 1 }, feedback: { vref: 1 }, compensator: { type: 'type2', r1: 10e3, r2: 10e3, c1: 10e-9, c2: 100e-12 } });
    const below = analyze(req(crit * 0.999));
    const above = analyze(req(crit * 1.001));
    expect(below.operatingPoint.conduction).toBe('DCM');
    expect(above.operatingPoint.conduction).toBe('CCM');
    expectRel(below.operatingPoint.duty, above.operatingPoint.duty, 2e-3, 'duty across the boundary');
    // Each side's plant moves little with ±0.1 % load, so the jump is the CCM-vs-DCM model difference.
    const farBelow = analyze(req(crit * 0.998));
    const farAbove = analyze(req(crit * 1.002));
    const jump = Math.abs(below.plant.dcGainDb! - above.plant.dcGainDb!);
    const own = Math.abs(farBelow.plant.dcGainDb! - farAbove.plant.dcGainDb!);
    expect(Math.abs(jump - own)).toBeLessThan(0.05);
  });

  it('current mode in DCM: one pole, no sampling pair, no subharmonic check', () => {
    const r = analyze(cm(lossless({ topology: 'buck-boost', vin: 12, vout: 5, iout: 0.02, l: 4.7e-6 }), 0.2, 0));
    expect(r.operatingPoint.conduction).toBe('DCM');
    expect(r.modulator.mode === 'peak-current' && r.modulator.samplingPoleHz).toBeNull();
    expect(r.plant.polesHz).toHaveLength(1);
    // Current-programmed buck-boost in DCM: the load pole at 2/(RC) as in voltage mode
    // (the output port is a power source P = ½·L·ipk²·fsw: Erickson & Maksimović 2nd ed. §12.3).
    expectRel(r.dcmPoleHz, 2 / ((5 / 0.02) * 100e-6) / TWO_PI, 1e-6);
    expect(r.checks.some((c) => c.id === 'subharmonic')).toBe(false);
  });
});

describe('backward compatibility', () => {
  it('a modulator without mode is voltage mode; a compensator without amplifier is an ideal op-amp', () => {
    const old: AnalyzeRequest = { ...cm(lossless({}), 0.1, 0), modulator: { vramp: 1.5 } };
    const explicit: AnalyzeRequest = { ...old, modulator: { mode: 'voltage', vramp: 1.5 }, compensator: { ...old.compensator, amplifier: 'opamp' } };
    const a = analyze(old);
    const b = analyze(explicit);
    expect(a.margins).toEqual(b.margins);
    expect(a.modulator).toEqual({ mode: 'voltage', vramp: 1.5, gain: 1 / 1.5 });
    expect(a.compensator.amplifier).toBe('opamp');
  });
});

describe('starting point follows the mode and the amplifier', () => {
  const cmBoostGm: AnalyzeRequest = sampleByKey('cm-boost-gm-type2').request;

  it('K factor around a gm amplifier meets the target fc and PM (ro aside), keeping gm and Rb', () => {
    const prepared = preparePlant(cmBoostGm);
    const fixed = shapeFromParts(cmBoostGm.compensator).fixed;
    const comp = proposeForPlant(prepared, { type: 'type2', crossoverHz: 8e3, phaseMarginDeg: 60, method: 'k-factor', r1: 40e3, fixed: { ...fixed, ro: undefined } });
    expect(comp.amplifier).toBe('transconductance');
    expect(comp.gm).toBe(1e-3);
    const m = analyze({ ...cmBoostGm, compensator: comp }).margins;
    expectRel(m.crossoverHz, 8e3, 0.01, 'fc');
    expectAbs(m.phaseMarginDeg, 60, 0.5, 'PM');
  });

  it('pole-zero rules in current mode place the zero at the load pole, not at the sampling pair', () => {
    const prepared = preparePlant(cmBoostGm);
    const comp = proposeForPlant(prepared, { type: 'type2', crossoverHz: 8e3, phaseMarginDeg: 60, method: 'pole-zero', r1: 40e3, fixed: shapeFromParts(cmBoostGm.compensator).fixed });
    expectRel(shapeFromParts(comp).zerosHz[0], prepared.plant.polesHz[0], 1e-9, 'zero at the load pole');
  });
});
