/**
 * Margin limits, read by the engine's checks (lib/engine/checks.ts) and by the
 * Tune readout's colours, so the two never disagree. Common practice: a phase
 * margin of 45–60° and a gain margin of 10 dB or more are comfortable; below
 * 30° / 6 dB a design rings hard or is near instability (see e.g. Erickson &
 * Maksimović, Fundamentals of Power Electronics, 2nd ed., §9.4).
 * This file imports nothing, so the engine may read it.
 */
export const MARGIN_LIMITS = {
  phaseMarginDeg: { caution: 45, risk: 30, aim: '45–60°' },
  gainMarginDb: { caution: 10, risk: 6 },
} as const;

export type MarginTone = 'good' | 'caution' | 'risk' | 'none';

/** How a margin reads against the limits; null (no margin found) is 'none'. */
export function marginTone(kind: keyof typeof MARGIN_LIMITS, value: number | null): MarginTone {
  if (value === null) return 'none';
  const l = MARGIN_LIMITS[kind];
  // Judged on the value as shown (0.1), as the Checks are: 44.96° reads 45.0° and is good.
  const shown = Math.round(value * 10) / 10;
  return shown < l.risk ? 'risk' : shown < l.caution ? 'caution' : 'good';
}
