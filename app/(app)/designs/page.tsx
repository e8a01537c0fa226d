import type { Metadata } from 'next';
import { getDb } from '@/db/client';
import { countDesigns, listDesignsPage } from '@/db/queries';
import { can, requireUser } from '@/lib/auth';
import { designListSearch, readDesignListQuery } from '@/lib/designs-list-query';
import { DesignsTable } from '@/components/designs/designs-table';
import { NewDesignButton } from '@/components/designs/new-design-button';

export const metadata: Metadata = { title: 'Designs' };

export default async function DesignsPage({ searchParams }: { searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  const user = await requireUser();
  const query = readDesignListQuery(await searchParams);
  const db = getDb();
  const first = listDesignsPage(db, user.teamId, query);
  const count = countDesigns(db, user.teamId);
  return (
    <div className="space-y-4">
      <div className="flex items-end justify-between">
        <div>
          <h1 className="text-2xl font-semibold">Designs</h1>
          <p className="text-sm text-slate-500">
            {user.teamName} · {count} design{count === 1 ? '' : 's'}
          </p>
        </div>
        {can.editDesigns(user.role) && <NewDesignButton />}
      </div>
      <DesignsTable key={user.teamId} teamId={user.teamId} initial={first} initialSearch={designListSearch(query)} />
    </div>
  );
}
