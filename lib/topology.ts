/** Topology names as a sentence starts them. */
export const TOPOLOGY_LABELS: Record<string, string> = { buck: 'Buck', boost: 'Boost', 'buck-boost': 'Buck-boost' };

export function topologyLabel(t: string) {
  return TOPOLOGY_LABELS[t] ?? t;
}
