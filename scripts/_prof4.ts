import { buildControlPlant } from '@/lib/engine/control';
import { withLossDefaults } from '@/lib/engine/steady-state';
import { MODE_SAMPLES } from '@/lib/engine/samples';
const r = MODE_SAMPLES[1].request; const conv = withLossDefaults(r.converter);
let sink: unknown; const t0 = Date.now();
while (Date.now() - t0 < 4000) sink = buildControlPlant(conv, r.modulator);
