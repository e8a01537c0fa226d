import { describe, expect, it } from 'vitest';
import { analyze } from '@/lib/engine/analyze';
import { analyzeCorners, worstCaseChecks } from '@/lib/engine/corners';
import { defaultRange, describeCorner, enumerateCorners, rangeIssues, type OperatingRange } from '@/lib/engine/range';
import { SAMPLE_DESIGNS } from '@/lib/engine/samples';
import { EngineInputError, type AnalyzeRequest } from '@/lib/engine/types';

const pointRange = (req: AnalyzeRequest): OperatingRange => ({
  vin: { min: req.converter.vin, max: req.converter.vin },
  iout: { min: req.converter.iout, max: req.converter.iout },
  l: { tol: 0 },
  c: { tol: 0 },
  rc: { min: req.converter.rc, max: req.converter.rc },
});

describe('corner sweep', () => {
  for (const s of SAMPLE_DESIGNS) {
    it(`${s.key}: every corner equals a single analyze() with the corner's values (exact)`, () => {
      const range = defaultRange(s.request.converter);
      const result = analyzeCorners(s.request, range);
      expect(result.corners).toHaveLength(32);
      for (const k of result.corners) {
        const single = analyze({ ...s.request, converter: { ...s.request.converter, vin: k.vin, iout: k.iout, l: k.l, c: k.c, rc: k.rc } });
        expect(k.margins.crossoverHz).toBe(single.margins.crossoverHz);
        expect(k.margins.phaseMarginDeg).toBe(single.margins.phaseMarginDeg);
        expect(k.margins.gainMarginDb).toBe(single.margins.gainMarginDb);
        expect(k.duty).toBe(single.operatingPoint.duty);
        expect(k.conduction).toBe(single.operatingPoint.conduction);
      }
    });

    it(`${s.key}: the worst corner is the lowest margin over the corners`, () => {
      const result = analyzeCorners(s.request, defaultRange(s.request.converter));
      const pms = result.corners.map((k) => k.margins.phaseMarginDeg!);
      expect(result.worst.phaseMarginDeg.value).toBe(Math.min(...pms));
      expect(result.corners[result.worst.phaseMarginDeg.corner!].margins.phaseMarginDeg).toBe(Math.min(...pms));
      const fcs = result.corners.map((k) => k.margins.crossoverHz!);
      expect(result.worst.crossoverHz).toEqual({ min: Math.min(...fcs), max: Math.max(...fcs) });
      const gms = result.corners.map((k) => k.margins.gainMarginDb).filter((g): g is number => g !== null);
      expect(result.worst.gainMarginDb.value).toBe(gms.length > 0 ? Math.min(...gms) : null);
    });
  }

  it('a range of zero width is one corner: the nominal analysis', () => {
    const req = SAMPLE_DESIGNS[1].request;
    const result = analyzeCorners(req, pointRange(req));
    expect(result.corners).toHaveLength(1);
    expect(result.corners[0].margins.phaseMarginDeg).toBe(analyze(req).margins.phaseMarginDeg);
    expect(result.corners[0].label).toBe('nominal');
  });

  it('enumerates vin slowest, ESR fastest, L and C as nominal·(1 ± tol)', () => {
    const cv = SAMPLE_DESIGNS[0].request.converter;
    const range = defaultRange(cv);
    const corners = enumerateCorners(cv, range);
    expect(corners[0]).toEqual({ vin: range.vin.min, iout: range.iout.min, l: cv.l * 0.8, c: cv.c * 0.8, rc: range.rc.min });
    expect(corners[1].rc).toBe(range.rc.max);
    expect(corners[31]).toEqual({ vin: range.vin.max, iout: range.iout.max, l: cv.l * 1.2, c: cv.c * 1.2, rc: range.rc.max });
    expect(describeCorner(cv, range, corners[16 + 8 + 1])).toBe('high line, full load, L −20 %, C −20 %, ESR high');
  });

  it('names the range field when a corner is impossible (a buck whose low line is below vout)', () => {
    const req = SAMPLE_DESIGNS[0].request;
    const range = { ...defaultRange(req.converter), vin: { min: 4, max: 26 } };
    try {
      analyzeCorners(req, range);
      throw new Error('expected EngineInputError');
    } catch (e) {
      expect(e).toBeInstanceOf(EngineInputError);
      expect((e as EngineInputError).issues[0].path).toBe('range.vin.min');
      expect((e as EngineInputError).issues[0].message).toMatch(/^at the corner low line/);
    }
  });

  it('range problems name their field', () => {
    const cv = SAMPLE_DESIGNS[0].request.converter;
    const bad: OperatingRange = { ...defaultRange(cv), vin: { min: 30, max: 20 }, iout: { min: 0, max: 3 }, l: { tol: 1.2 } };
    expect(rangeIssues(bad).map((i) => i.path)).toEqual(['range.vin.max', 'range.iout.min', 'range.l.tol']);
  });

  it('worst-case checks name the corner and compare with the targets', () => {
    const s = SAMPLE_DESIGNS[1];
    const result = analyzeCorners(s.request, defaultRange(s.request.converter));
    const checks = worstCaseChecks(result);
    const pm = checks.find((c) => c.id === 'worst-phase-margin')!;
    const worst = result.corners[result.worst.phaseMarginDeg.corner!];
    expect(pm.message).toContain(worst.label);
    expect(pm.message).toContain(`${result.worst.phaseMarginDeg.value!.toFixed(1)}°`);
    expect(pm.level).toBe(result.worst.phaseMarginDeg.value! < 30 ? 'risk' : 'caution');
    // Under 30° stays a risk whatever the target (common practice); above it the target decides.
    const buck = SAMPLE_DESIGNS[0];
    const buckCorners = analyzeCorners(buck.request, defaultRange(buck.request.converter));
    const worstPm = buckCorners.worst.phaseMarginDeg.value!;
    expect(worstPm).toBeGreaterThan(30);
    const level = (target: number) => worstCaseChecks(buckCorners, { phaseMarginDeg: target, gainMarginDb: 10 }).find((c) => c.id === 'worst-phase-margin')!.level;
    expect(level(worstPm - 1)).toBe('note');
    expect(level(worstPm + 1)).toBe('caution');
  });

  it('a risk at some corner (current loop unstable at low line) is a worst-case risk naming the corner', () => {
    // Peak current-mode boost of our own, 5 → 12 V: at 4.5 V the duty is about 0.64, and with
    // Se = 20 kV/s mc·D' falls below 0.5, the subharmonic limit (Ridley 1991; common practice:
    // without enough slope compensation peak current mode is unstable above D ≈ 0.5).
    const request: AnalyzeRequest = {
      converter: { topology: 'boost', vin: 5, vout: 12, iout: 1, fsw: 400e3, l: 6.8e-6, rl: 0.025, c: 44e-6, rc: 0.004, vd: 0.35 },
      modulator: { mode: 'peak-current', ri: 0.1, se: 2e4 },
      feedback: { vref: 1.2 },
      compensator: { type: 'type2', amplifier: 'transconductance', gm: 1e-3, ro: 10e6, rb: 11e3, r1: 100e3, r2: 4.53e3, c1: 22e-9, c2: 1.5e-9 },
    };
    const range: OperatingRange = { vin: { min: 4.5, max: 5.5 }, iout: { min: 0.1, max: 1 }, l: { tol: 0.2 }, c: { tol: 0.3 }, rc: { min: 0.002, max: 0.008 } };
    expect(analyze(request).checks.find((c) => c.id === 'subharmonic')?.level).toBe('caution');
    const result = analyzeCorners(request, range);
    const risky = result.corners.filter((k) => k.risks.some((r) => r.id === 'subharmonic'));
    expect(risky.length).toBeGreaterThan(0);
    for (const k of risky) expect(k.vin).toBe(4.5);
    const check = worstCaseChecks(result).find((c) => c.id === 'worst-subharmonic')!;
    expect(check.level).toBe('risk');
    expect(check.message).toContain(risky[0].label);
    // Enough ramp for the lowest line clears it at every corner.
    const ramped = analyzeCorners({ ...request, modulator: { mode: 'peak-current', ri: 0.1, se: 8.2e4 } }, range);
    expect(ramped.corners.every((k) => !k.risks.some((r) => r.id === 'subharmonic'))).toBe(true);
  });

  it('default range: a buck keeps its low line above vout, a boost its high line below vout', () => {
    const buck = defaultRange({ ...SAMPLE_DESIGNS[0].request.converter, vin: 5.2, vout: 5 });
    expect(buck.vin.min).toBeGreaterThan(5);
    const boost = defaultRange({ ...SAMPLE_DESIGNS[1].request.converter, vin: 11.5, vout: 12 });
    expect(boost.vin.max).toBeLessThan(12);
  });
});
