import type { Metadata } from 'next';
import { getDb } from '@/db/client';
import { designsListView } from '@/lib/designs-list-cache';
import { can, requireUser } from '@/lib/auth';
import { designListSearch, readDesignListQuery } from '@/lib/designs-list-query';
import { DesignsTable } from '@/components/designs/designs-table';
import { DesignListFilterTabs, type DesignListView } from '@/components/designs/list-filter';
import { NewDesignButton } from '@/components/designs/new-design-button';

export const metadata: Metadata = { title: 'Designs' };

const EMPTY: Record<DesignListView, string> = {
  active: 'No designs yet.',
  waiting: 'Nothing waits for your review.',
  archived: 'No archived designs.',
};

export default async function DesignsPage({ searchParams }: { searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  const user = await requireUser();
  const query = readDesignListQuery(await searchParams);
  const view: DesignListView = query.waiting === 'me' ? 'waiting' : query.archived === 'archived' ? 'archived' : 'active';
  const db = getDb();
  const viewer = { teamId: user.teamId, userId: user.id, role: user.role };
  const { page: first, count, waitingCount, reviewsUnnamed } = designsListView(db, viewer, query);
  return (
    <div className="space-y-4">
      <div className="flex flex-wrap items-end justify-between gap-3">
        <div>
          <h1 className="text-2xl font-semibold">Designs</h1>
          <p className="text-sm text-slate-500">
            {user.teamName} · {view === 'active' ? `${count} design${count === 1 ? '' : 's'}` : `${first.total} ${view === 'archived' ? 'archived design' : 'design'}${first.total === 1 ? '' : 's'}`}
            {view === 'waiting' ? ' waiting for your review' : ''}
          </p>
        </div>
        <DesignListFilterTabs view={view} waitingCount={waitingCount} showWaiting={user.role === 'reviewer' || reviewsUnnamed || waitingCount > 0} />
        {can.editDesigns(user.role) && <NewDesignButton />}
      </div>
      <DesignsTable key={user.teamId} teamId={user.teamId} initial={first} initialSearch={designListSearch(query)} emptyText={EMPTY[view]} />
    </div>
  );
}
