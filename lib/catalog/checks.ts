/**
 * Short names of the engine's checks, for tables and lists where the full message does not
 * fit (the message stays in the tooltip). Ids not listed read as themselves, hyphens spaced.
 */
export const CHECK_LABELS: Readonly<Record<string, string>> = {
  'phase-margin-low': 'Low phase margin',
  'gain-margin-low': 'Low gain margin',
  'no-crossover': 'No crossover',
  'multiple-crossovers': 'Several crossovers',
  'conditional-stability': 'Conditionally stable',
  'crossover-above-sweep': 'Crossover above sweep',
  'crossover-vs-rhp-zero': 'Crossover near RHP zero',
  'crossover-vs-switching': 'Crossover near fsw',
  'duty-extreme': 'Duty near its limit',
  subharmonic: 'Subharmonic oscillation',
  'dcm-model': 'DCM model in use',
  'corners-in-dcm': 'DCM at some corners',
  'divider-setpoint': 'Divider set point',
  'part-range': 'Part out of range',
  'opamp-bandwidth': 'Op-amp too slow',
  'worst-phase-margin': 'Worst phase margin',
  'worst-gain-margin': 'Worst gain margin',
  'worst-no-crossover': 'No crossover at a corner',
};

/** The short label of a check id; a corner's `worst-<id>` reads as its check's label. */
export const checkLabel = (id: string): string => {
  const known = CHECK_LABELS[id];
  if (known) return known;
  if (id.startsWith('worst-')) {
    const inner = CHECK_LABELS[id.slice('worst-'.length)];
    if (inner) return inner;
  }
  const words = id.replace(/^worst-/, '').replace(/-/g, ' ');
  return words.charAt(0).toUpperCase() + words.slice(1);
};
