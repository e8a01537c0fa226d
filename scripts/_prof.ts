import { analyze, analyzeLoop, preparePlant, analyzeParts } from '@/lib/engine/analyze';
import { validateRequest } from '@/lib/engine/validate';
import { buildControlPlant } from '@/lib/engine/control';
import { withLossDefaults } from '@/lib/engine/steady-state';
import { MODE_SAMPLES, SAMPLE_DESIGNS } from '@/lib/engine/samples';
let sink: unknown;
const time = (f: () => unknown, n = 4000) => { for (let i = 0; i < 2000; i++) sink = f(); const ts: number[] = []; for (let b = 0; b < 200; b++) { const t0 = process.hrtime.bigint(); for (let i = 0; i < 10; i++) sink = f(); ts.push(Number(process.hrtime.bigint() - t0) / 1e4); } ts.sort((a, b) => a - b); return `${ts[100].toFixed(1)}/${ts[0].toFixed(1)}`; };
const all = [...SAMPLE_DESIGNS.map((s) => ({ name: s.key, request: s.request })), ...MODE_SAMPLES];
for (const { name, request } of all) {
  const prepared = preparePlant(request);
  const loop = analyzeLoop(prepared, request.compensator);
  const conv = withLossDefaults(request.converter);
  console.log(name.slice(0, 60).padEnd(60),
    'full', time(() => analyze(request)),
    'valid', time(() => validateRequest(request)),
    'ctrl', time(() => buildControlPlant(conv, request.modulator)),
    'prep', time(() => preparePlant(request)),
    'loop', time(() => analyzeLoop(prepared, request.compensator)),
    'parts', time(() => analyzeParts(prepared, request.compensator, request.parts, loop.margins)));
}
