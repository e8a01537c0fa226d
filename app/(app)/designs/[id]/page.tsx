import type { Metadata } from 'next';
import { notFound } from 'next/navigation';
import { getDb } from '@/db/client';
import { getDesign, getLatestRevision } from '@/db/queries';
import { getCurrentUser } from '@/lib/auth';
import { CautionsPanel } from '@/components/cautions-panel';

export const metadata: Metadata = { title: 'Design' };

export default async function DesignPage({ params }: { params: Promise<{ id: string }> }) {
  const { id } = await params;
  const user = (await getCurrentUser())!;
  const db = getDb();
  const design = Number.isInteger(Number(id)) ? getDesign(db, user.teamId, Number(id)) : undefined;
  if (!design) notFound();
  const latest = getLatestRevision(db, design.id);
  return (
    <div className="space-y-4">
      <h1 className="text-2xl font-semibold">{design.name}</h1>
      <p className="text-sm text-slate-500">
        {design.topology} · {latest ? `r${latest.number}` : 'not saved yet'}
      </p>
      <CautionsPanel />
    </div>
  );
}
