import type { Metadata } from 'next';
import { CautionsPanel } from '@/components/cautions-panel';

export const metadata: Metadata = { title: 'Limits and cautions' };

export default function CautionsPage() {
  return (
    <div className="mx-auto max-w-3xl space-y-4">
      <h1 className="text-2xl font-semibold">Limits and cautions</h1>
      <p className="text-sm text-slate-600">
        Phasewright helps you shape and document a compensation network. It does not replace measurement, safety engineering or the
        judgement of a qualified engineer.
      </p>
      <CautionsPanel full />
    </div>
  );
}
