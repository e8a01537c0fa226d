import { analyze } from '@/lib/engine/analyze';
import { SAMPLE_DESIGNS, MODE_SAMPLES } from '@/lib/engine/samples';
const which = process.argv[2] ?? 'samples';
const reqs = which === 'samples' ? SAMPLE_DESIGNS.map((s) => s.request) : which === 'all' ? [...SAMPLE_DESIGNS.map((s) => s.request), ...MODE_SAMPLES.map((m) => m.request)] : [SAMPLE_DESIGNS[+which].request];
let sink: unknown;
const warm = +(process.argv[3] ?? 3000);
for (let i = 0; i < warm; i++) sink = analyze(reqs[i % reqs.length]);
const ts: number[] = [];
let c = 0;
for (let b = 0; b < 400; b++) { const t0 = process.hrtime.bigint(); for (let i = 0; i < 10; i++) sink = analyze(reqs[c++ % reqs.length]); ts.push(Number(process.hrtime.bigint() - t0) / 1e4); }
console.log(which, warm, ts.slice(0, 40).map((x) => x.toFixed(0)).join(' '));
ts.sort((a, b) => a - b); console.log('   quantiles 0,.1,.25,.5,.75,.9:', [0, 0.1, 0.25, 0.5, 0.75, 0.9].map((q) => ts[Math.floor(q * 399)].toFixed(1)).join(' '));
