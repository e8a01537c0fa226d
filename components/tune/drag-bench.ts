/**
 * The Tune screen's drag path, for `npm run bench`: one handle move to new
 * margins, parts and Plotly trace data, as the screen computes them (no DOM).
 */
import { buildBodeTraces, computeRanges, type BodeSeries } from '@/components/plot/bode-traces';
import { preparePlant } from '@/lib/engine/analyze';
import { SAMPLE_DESIGNS } from '@/lib/engine/samples';
import { compensatorFromShape, handlesOf, moveFrequency, shapeFromParts } from './handles';
import { analyzeCompensator, analyzeCompensatorParts } from './tune-analysis';

export const tuneDragCase = () => {
  const requests = SAMPLE_DESIGNS.map((s) => s.request);
  const prepared = requests.map((r) => preparePlant(r));
  const shapes = requests.map((r) => shapeFromParts(r.compensator));
  return {
    name: 'Tune drag: move a zero (gain held) → parts → analyzeLoop → snapped parts → Plotly traces (400 points)',
    targetUs: 16_000,
    batch: 5,
    run: (i: number) => {
      const k = i % prepared.length;
      const shape = shapes[k];
      const moved = compensatorFromShape(moveFrequency(shape, 'z0', shape.zerosHz[0] * (1 + 0.05 * Math.sin(i * 0.37))));
      if (!moved.ok) throw new Error(moved.issues[0]?.message);
      const loop = analyzeCompensator(prepared[k], moved.comp);
      if (!loop.ok) throw new Error(loop.issues[0]?.message);
      const { bode, margins } = loop.value;
      const parts = analyzeCompensatorParts(prepared[k], moved.comp, requests[k].parts);
      const series: BodeSeries[] = (['loop', 'plant', 'compensator'] as const).map((id) => ({ id, name: id, color: '#000', magDb: bode[id].magDb, phaseDeg: bode[id].phaseDeg }));
      const content = { f: bode.f, series, margins: [margins] };
      const traces = buildBodeTraces(content, computeRanges(content));
      return [traces.length, parts, handlesOf(shapeFromParts(moved.comp), margins.crossoverHz)];
    },
  };
};
