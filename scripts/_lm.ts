import * as A from '@/lib/engine/analyze';
import { compensatorTransfer } from '@/lib/engine/compensator';
import { multiplyTransfers } from '@/lib/engine/transfer';
import { sweepComplex, transferEvaluator } from '@/lib/engine/sweep';
import { computeMarginsFromComplex } from '@/lib/engine/margins';
import { MODE_SAMPLES } from '@/lib/engine/samples';
let sink: unknown;
const best = (name: string, f: () => unknown) => { for (let i = 0; i < 3000; i++) sink = f(); let b = 1e9; for (let k = 0; k < 300; k++) { const t0 = process.hrtime.bigint(); for (let i = 0; i < 10; i++) sink = f(); b = Math.min(b, Number(process.hrtime.bigint() - t0) / 1e4); } return `${name} ${b.toFixed(2)}`; };
for (const k of [1, 2]) {
const r = MODE_SAMPLES[k].request; const p = A.preparePlant(r);
const snapped = A.withLoopDivider(p, A.standardValueCompensator(r.compensator));
const gc = compensatorTransfer(snapped);
const loop = multiplyTransfers(p.plantTransfer, gc);
const t = sweepComplex(loop, p.grid);
const ev = transferEvaluator(loop, p.grid.f[0]);
let calls = 0; const evc = (hz: number) => { calls++; return ev(hz); };
computeMarginsFromComplex(p.grid.f, t.re, t.im, evc);
console.log(MODE_SAMPLES[k].name, 'evaluator calls', calls, [
best('all', () => A.loopMargins(p.plantTransfer, p.grid, snapped)),
best('snap', () => A.withLoopDivider(p, A.standardValueCompensator(r.compensator))),
best('gc', () => compensatorTransfer(snapped)),
best('mult', () => multiplyTransfers(p.plantTransfer, gc)),
best('sweepC', () => sweepComplex(loop, p.grid)),
best('evaluator', () => transferEvaluator(loop, p.grid.f[0])),
best('marginsC', () => computeMarginsFromComplex(p.grid.f, t.re, t.im, ev)),
best('1 eval', () => ev(1234.5)),
].join(' | '));
}
{
const r = MODE_SAMPLES[1].request; const p = A.preparePlant(r);
const snapped = A.withLoopDivider(p, A.standardValueCompensator(r.compensator));
const loop = multiplyTransfers(p.plantTransfer, compensatorTransfer(snapped));
const t = sweepComplex(loop, p.grid);
const f = p.grid.f;
console.log(best('bare loop', () => { let c = 0; const re = t.re, im = t.im; let m0 = re[0] * re[0] + im[0] * im[0]; for (let i = 0; i + 1 < f.length; i++) { const m1 = re[i + 1] * re[i + 1] + im[i + 1] * im[i + 1]; if (m0 >= 1 !== m1 >= 1) c++; if (im[i] >= 0 !== im[i + 1] >= 0) c += 2; m0 = m1; } return c; }));
console.log(Array.from(t.im.slice(0, 400)).filter((x, i, a) => i > 0 && (x >= 0) !== (a[i - 1] >= 0)).length, 'im sign changes');
}
