import type { Metadata } from 'next';
import { getDb } from '@/db/client';
import { countDesignsWaitingFor, getTeamSignoffSettings, listDesigns } from '@/db/queries';
import { mayReview } from '@/lib/signoff-policy';
import { can, requireUser } from '@/lib/auth';
import { DesignsTable } from '@/components/designs/designs-table';
import { DesignListFilterTabs, type DesignListView } from '@/components/designs/list-filter';
import { NewDesignButton } from '@/components/designs/new-design-button';

export const metadata: Metadata = { title: 'Designs' };

const EMPTY: Record<DesignListView, string> = {
  active: 'No designs yet.',
  waiting: 'Nothing waits for your review.',
  archived: 'No archived designs.',
};

export default async function DesignsPage({ searchParams }: { searchParams: Promise<{ view?: string }> }) {
  const user = await requireUser();
  const { view: asked } = await searchParams;
  const view: DesignListView = asked === 'waiting' || asked === 'archived' ? asked : 'active';
  const db = getDb();
  const reviewsUnnamed = mayReview(user.role, getTeamSignoffSettings(db, user.teamId));
  const designs = listDesigns(db, user.teamId, {
    archived: view === 'archived' ? 'archived' : view === 'waiting' ? 'all' : 'active',
    waitingForUserId: view === 'waiting' ? user.id : undefined,
    reviewsUnnamed,
  });
  const waitingCount = countDesignsWaitingFor(db, user.teamId, user.id, reviewsUnnamed);
  return (
    <div className="space-y-4">
      <div className="flex flex-wrap items-end justify-between gap-3">
        <div>
          <h1 className="text-2xl font-semibold">Designs</h1>
          <p className="text-sm text-slate-500">
            {user.teamName} · {designs.length} {view === 'archived' ? 'archived ' : ''}design{designs.length === 1 ? '' : 's'}
            {view === 'waiting' ? ' waiting for your review' : ''}
          </p>
        </div>
        <DesignListFilterTabs view={view} waitingCount={waitingCount} showWaiting={user.role === 'reviewer' || reviewsUnnamed || waitingCount > 0} />
        {can.editDesigns(user.role) && <NewDesignButton />}
      </div>
      <DesignsTable designs={designs} emptyText={EMPTY[view]} />
    </div>
  );
}
