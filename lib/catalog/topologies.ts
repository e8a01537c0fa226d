/** Topologies and modes as people read them. */
import type { Amplifier, ModulatorMode, Topology } from '../engine/types';

export const TOPOLOGY_LABELS = {
  buck: 'Buck',
  boost: 'Boost',
  'buck-boost': 'Buck-boost (inverting)',
} as const satisfies Record<Topology, string>;

export const MODULATOR_MODE_LABELS = {
  voltage: 'Voltage mode (fixed ramp)',
} as const satisfies Record<ModulatorMode, string>;

export const AMPLIFIER_LABELS = {
  opamp: 'Op-amp',
} as const satisfies Record<Amplifier, string>;

export const topologyLabel = (t: Topology): string => TOPOLOGY_LABELS[t];
