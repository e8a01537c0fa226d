import { preparePlant, loopCompensatorTransfer } from '@/lib/engine/analyze';
import { MODE_SAMPLES, SAMPLE_DESIGNS } from '@/lib/engine/samples';
const all = [...SAMPLE_DESIGNS.map((s) => ({ name: s.key, request: s.request })), ...MODE_SAMPLES];
for (const { name, request } of all) {
  const p = preparePlant(request);
  const c = loopCompensatorTransfer(p, request.compensator);
  const fmt = (h: any) => `g=${h.gain.toExponential(2)} o=${h.originOrder} N=${JSON.stringify(h.num.map((s: number[]) => s.map((x) => +x.toExponential(2))))} D=${JSON.stringify(h.den.map((s: number[]) => s.map((x) => +x.toExponential(2))))}`;
  console.log(name.slice(0, 50)); console.log('  plant', fmt(p.plantTransfer)); console.log('  comp ', fmt(c));
}
