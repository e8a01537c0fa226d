import type { Metadata } from 'next';
import { getDb } from '@/db/client';
import { listDesigns } from '@/db/queries';
import { can, requireUser } from '@/lib/auth';
import { DesignsTable } from '@/components/designs/designs-table';
import { NewDesignButton } from '@/components/designs/new-design-button';

export const metadata: Metadata = { title: 'Designs' };

export default async function DesignsPage() {
  const user = await requireUser();
  const designs = listDesigns(getDb(), user.teamId);
  return (
    <div className="space-y-4">
      <div className="flex items-end justify-between">
        <div>
          <h1 className="text-2xl font-semibold">Designs</h1>
          <p className="text-sm text-slate-500">
            {user.teamName} · {designs.length} design{designs.length === 1 ? '' : 's'}
          </p>
        </div>
        {can.editDesigns(user.role) && <NewDesignButton />}
      </div>
      <DesignsTable designs={designs} />
    </div>
  );
}
