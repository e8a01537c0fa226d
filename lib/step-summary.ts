import { formatSi } from '@/lib/units/si';
import { simulateStepResponse } from '@/lib/engine/step-response';
import type { AnalyzeRequest, StepDefinition } from '@/lib/engine/types';
import { roundSignificant } from '@/lib/engine/precision';

/** The step a revision is checked with: its own, or half to full load in 1 µs. */
export const stepOf = (input: AnalyzeRequest): StepDefinition =>
  input.step ?? { kind: 'load', from: input.converter.iout / 2, to: input.converter.iout, slew: input.converter.iout / 2 / 1e-6, band: 0.01 };

/** Words for a step: "load 1.5 → 3 A in 1 µs". */
export const describeStep = (s: StepDefinition): string => {
  const unit = s.kind === 'load' ? 'A' : 'V';
  const rise = s.slew ? ` in ${formatSi(Math.abs(s.to - s.from) / s.slew, 's')}` : ', ideal step';
  return `${s.kind} ${s.from} → ${s.to} ${unit}${rise}`;
};

/** A revision's step response for Compare and the report (arrays rounded), or null when it cannot be computed. */
export const stepResponseOf = (label: string, input: AnalyzeRequest, step: StepDefinition) => {
  try {
    const r = simulateStepResponse(input, step);
    return {
      label,
      t: r.t.map((x) => roundSignificant(x)),
      vout: r.vout.map((x) => roundSignificant(x)),
      peakDeviation: r.peakDeviation,
      settlingTime: r.settlingTime,
      outsideModel: r.outsideModel,
    };
  } catch {
    return null;
  }
};
