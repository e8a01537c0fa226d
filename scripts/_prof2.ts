import { analyze } from '@/lib/engine/analyze';
import { MODE_SAMPLES, SAMPLE_DESIGNS } from '@/lib/engine/samples';
const all = [...SAMPLE_DESIGNS.map((s) => s.request), ...MODE_SAMPLES.map((m) => m.request)];
const pick = process.argv[2] === undefined ? all : [all[+process.argv[2]]];
let sink: unknown;
const t0 = Date.now();
while (Date.now() - t0 < 6000) for (const r of pick) sink = analyze(r);
