/**
 * Trace colours of every Bode plot (Tune, Compare, the report's SVG): one
 * meaning, one colour everywhere. Colour-blind safe pairs (indigo / teal / amber).
 */
export const TRACE_COLORS = {
  loop: '#4f46e5',
  plant: '#0d9488',
  compensator: '#d97706',
  rhp: '#dc2626',
  bench: '#6b7280',
  difference: '#be123c',
  grid: '#e2e8f0',
  guide: '#94a3b8',
  text: '#334155',
} as const;

/** Compare: revision A is drawn muted and dashed, B in the Tune colours. */
export const COMPARE_COLORS = {
  a: { loop: '#64748b', plant: '#5eead4', compensator: '#fcd34d', dash: 'dash', width: 2 },
  b: { loop: TRACE_COLORS.loop, plant: TRACE_COLORS.plant, compensator: TRACE_COLORS.compensator, dash: 'solid', width: 2.5 },
} as const;

export type TraceName = keyof typeof TRACE_COLORS;
