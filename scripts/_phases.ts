import * as A from '@/lib/engine/analyze';
import { validateRequest, stageIssues, compensatorIssues } from '@/lib/engine/validate';
import { buildControlPlant } from '@/lib/engine/control';
import { withLossDefaults } from '@/lib/engine/steady-state';
import { summarizeTransfer, multiplyTransfers } from '@/lib/engine/transfer';
import { sweepTransfer, sweepComplex, transferEvaluator, makeGrid, logSweep } from '@/lib/engine/sweep';
import { computeMargins } from '@/lib/engine/margins';
import { summarizeCompensator, compensatorTransfer } from '@/lib/engine/compensator';
import { loopChecks, partChecks, stageChecks, modulatorChecks } from '@/lib/engine/checks';
import { esrZeroHint } from '@/lib/engine/plant';
import { MODE_SAMPLES, SAMPLE_DESIGNS } from '@/lib/engine/samples';
let sink: unknown;
const best = (f: () => unknown) => { for (let i = 0; i < 3000; i++) sink = f(); let b = 1e9; for (let k = 0; k < 300; k++) { const t0 = process.hrtime.bigint(); for (let i = 0; i < 10; i++) sink = f(); b = Math.min(b, Number(process.hrtime.bigint() - t0) / 1e4); } return b; };
const all = [...SAMPLE_DESIGNS.map((s) => ({ name: s.key, request: s.request })), ...MODE_SAMPLES];
if (process.env.POLLUTE) for (let i = 0; i < 20000; i++) sink = A.analyze(all[i % all.length].request);
const idx = process.argv[2] ? [+process.argv[2]] : all.map((_, i) => i);
for (const i of idx) {
  const { name, request } = all[i];
  const prepared = A.preparePlant(request);
  const conv = withLossDefaults(request.converter);
  const ctl = buildControlPlant(conv, request.modulator);
  const gc = A.loopCompensatorTransfer(prepared, request.compensator);
  const loop = A.analyzeLoop(prepared, request.compensator);
  const hint = esrZeroHint(conv);
  const lp = multiplyTransfers(prepared.plantTransfer, gc);
  const grid = prepared.grid;
  const ph: Record<string, number> = {
    full: best(() => A.analyze(request)),
    validate: best(() => validateRequest(request)),
    stageIssues: best(() => stageIssues(request)),
    compIssues: best(() => compensatorIssues(request.compensator)),
    lossDefaults: best(() => withLossDefaults(request.converter)),
    control: best(() => buildControlPlant(conv, request.modulator)),
    summarize3: best(() => [summarizeTransfer(ctl.plantTransfer, hint), summarizeTransfer(ctl.lineToOutput, hint), summarizeTransfer(ctl.outputImpedance, hint)]),
    grid: best(() => makeGrid(logSweep(10, conv.fsw / 2, 400))),
    sweepPlant: best(() => sweepTransfer(prepared.plantTransfer, grid)),
    stageChecks: best(() => [...stageChecks(prepared.operatingPoint), ...modulatorChecks(prepared.operatingPoint, prepared.modulator, prepared.dcmPoleHz)]),
    compTransfer: best(() => A.loopCompensatorTransfer(prepared, request.compensator)),
    sweepComp: best(() => sweepTransfer(gc, grid)),
    evaluator: best(() => A.evaluateLoopGain(prepared, gc, 0)),
    margins: best(() => computeMargins({ f: grid.f, ...loop.bode.loop }, A.evaluateLoopGain(prepared, gc, loop.bode.loop.phaseDeg[0]))),
    summComp: best(() => summarizeCompensator(request.compensator)),
    loopChecks: best(() => loopChecks({ margins: loop.margins, loop: { f: grid.f, ...loop.bode.loop }, fsw: conv.fsw, rhpZeroHz: prepared.plant.rhpZeroHz })),
    partChecks: best(() => partChecks(request.compensator, 1e4)),
    analyzeLoop: best(() => A.analyzeLoop(prepared, request.compensator)),
    preparePlant: best(() => A.preparePlant(request)),
    parts: best(() => A.analyzeParts(prepared, request.compensator, request.parts, loop.margins)),
    snapMargins: best(() => A.marginsForCompensator(prepared, A.standardValueCompensator(request.compensator))),
    sweepComplexLoop: best(() => sweepComplex(lp, grid)),
  };
  console.log(name.slice(0, 40), Object.entries(ph).map(([k, v]) => `${k} ${v.toFixed(1)}`).join(' | '));
}
