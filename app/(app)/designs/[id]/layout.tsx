import Link from 'next/link';
import { notFound } from 'next/navigation';
import { getDb } from '@/db/client';
import { getDesign, getLatestRevision, hasSignoffTrail } from '@/db/queries';
import { can, requireUser } from '@/lib/auth';
import { topologyLabel } from '@/lib/catalog/topologies';
import { ArchiveControl } from '@/components/designs/archive-control';
import { DesignTabs } from '@/components/designs/design-tabs';

export default async function DesignLayout({ children, params }: { children: React.ReactNode; params: Promise<{ id: string }> }) {
  const { id } = await params;
  const user = await requireUser();
  const db = getDb();
  const design = /^\d+$/.test(id) ? getDesign(db, user.teamId, Number(id)) : undefined;
  if (!design) notFound();
  const latest = getLatestRevision(db, design.id);
  return (
    <div className="space-y-4">
      <div className="flex flex-wrap items-end gap-x-6 gap-y-2">
        <div>
          <Link href="/designs" className="text-xs text-slate-500 hover:underline">
            ← Designs
          </Link>
          <h1 className="text-2xl font-semibold" data-testid="design-name">
            {design.name}
          </h1>
          <p className="text-sm text-slate-500">
            {topologyLabel(design.topology)} · {latest ? `latest r${latest.number}` : 'not saved yet'}
            {design.description ? ` · ${design.description}` : ''}
          </p>
        </div>
        <DesignTabs designId={design.id} />
        <ArchiveControl
          designId={design.id}
          name={design.name}
          archivedAt={design.archivedAt?.toISOString() ?? null}
          canEdit={can.editDesigns(user.role)}
          deletable={!hasSignoffTrail(db, design.id)}
        />
      </div>
      {children}
    </div>
  );
}
