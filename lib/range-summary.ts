import { analyzeCorners } from '@/lib/engine/corners';
import { rangeOf, targetsOf, type MarginTargets, type OperatingRange, type RangeFields } from '@/lib/engine/range';
import { runSpread, type Percentiles } from '@/lib/engine/spread';
import { EngineInputError, type AnalyzeRequest } from '@/lib/engine/types';
import { formatCount } from '@/lib/format';

/**
 * A revision's worst case across its operating range, for Compare, the report and the review
 * mail: the worst corner of each margin (value and where), the crossover span, and a spread
 * of a fixed size and seed so the same revision always reports the same numbers.
 */
export interface RangeSummary {
  range: OperatingRange;
  targets: MarginTargets;
  corners: number;
  dcmCorners: number;
  /** Risk checks raised at some corner (e.g. a current loop unstable at low line): id, how many corners, the first one. Absent in summaries from before. */
  risks?: { id: string; count: number; corner: string; message: string }[];
  worst: {
    phaseMarginDeg: { value: number | null; corner: string | null };
    gainMarginDb: { value: number | null; corner: string | null };
    crossoverHz: { min: number | null; max: number | null };
  };
  spread: {
    samples: number;
    seed: number;
    distribution: 'uniform' | 'normal';
    percentiles: { crossoverHz: Percentiles | null; phaseMarginDeg: Percentiles | null; gainMarginDb: Percentiles | null };
    meetsTargets: { count: number; share: number };
  };
}

/** Spread size and seed of the summary: enough for the 1st percentile to settle, quick on a server. */
export const SUMMARY_SPREAD = { samples: 2000, seed: 1 } as const;

/** The summary, or why there is none (a range no circuit can be). */
export function summarizeRange(input: AnalyzeRequest & RangeFields): { ok: true; value: RangeSummary } | { ok: false; message: string } {
  const range = rangeOf(input);
  const targets = targetsOf(input);
  try {
    const c = analyzeCorners(input, range);
    const s = runSpread(input, range, { ...SUMMARY_SPREAD, targets });
    const at = (i: number | null) => (i === null ? null : c.corners[i].label);
    return {
      ok: true,
      value: {
        range,
        targets,
        corners: c.corners.length,
        dcmCorners: c.corners.filter((k) => k.conduction === 'DCM').length,
        risks: cornerRisks(c.corners),
        worst: {
          phaseMarginDeg: { value: c.worst.phaseMarginDeg.value, corner: at(c.worst.phaseMarginDeg.corner) },
          gainMarginDb: { value: c.worst.gainMarginDb.value, corner: at(c.worst.gainMarginDb.corner) },
          crossoverHz: c.worst.crossoverHz,
        },
        spread: { samples: s.samples, seed: s.seed, distribution: s.distribution, percentiles: s.percentiles, meetsTargets: s.meetsTargets },
      },
    };
  } catch (err) {
    if (err instanceof EngineInputError) return { ok: false, message: err.issues[0]?.message ?? err.message };
    throw err;
  }
}

function cornerRisks(corners: { label: string; risks: { id: string; message: string }[] }[]): NonNullable<RangeSummary['risks']> {
  const out = new Map<string, { id: string; count: number; corner: string; message: string }>();
  for (const k of corners)
    for (const r of k.risks) {
      const seen = out.get(r.id);
      if (seen) seen.count++;
      else out.set(r.id, { id: r.id, count: 1, corner: k.label, message: r.message });
    }
  return [...out.values()];
}

const fixed = (v: number) => v.toFixed(1).replace(/^-/, '−');

/** One sentence for mails and reports: "Worst case over 32 corners: PM 31.2° at low line, …". */
export function worstCaseSentence(s: RangeSummary): string {
  const pm = s.worst.phaseMarginDeg;
  const gm = s.worst.gainMarginDb;
  const pmText = pm.value === null ? (pm.corner ? `no crossover at ${pm.corner}` : 'PM —') : `PM ${fixed(pm.value)}° at ${pm.corner}`;
  const gmText = gm.value === null ? 'GM: no −180° crossing at any corner' : `GM ${fixed(gm.value)} dB at ${gm.corner}`;
  const share = (s.spread.meetsTargets.share * 100).toFixed(1);
  const risks = (s.risks ?? []).map((r) => ` Risk "${r.id}" at ${r.count} of ${s.corners} corners (first: ${r.corner}).`).join('');
  return `Worst case over ${s.corners} corners: ${pmText}; ${gmText}.${risks} ${share} % of ${formatCount(s.spread.samples)} simulated builds (seed ${s.spread.seed}) meet PM ≥ ${s.targets.phaseMarginDeg}° and GM ≥ ${s.targets.gainMarginDb} dB.`;
}
