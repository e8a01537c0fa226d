import { LRUCache } from 'lru-cache';
import type { Db } from '@/db/connection';
import { countDesigns, countDesignsWaitingFor, listDesignsPage, teamListState, type DesignPage } from '@/db/queries';
import type { DesignListQuery } from '@/lib/designs-list-query';
import { mayReview } from '@/lib/signoff-policy';
import type { Role } from '@/lib/catalog';

/**
 * The designs list as a team sees it, cached by the team's list version: triggers bump it on
 * every change the list shows (migration team_list_version_triggers), so a cached answer is
 * never stale, and a team that reloads its list (the page, refetch on focus, scripts) reads one
 * row instead of a page of designs and its counts. Per process; bounded by count and size.
 * Cached pages are shared between requests: read them, never change them.
 */
const pages = new LRUCache<string, { page: DesignPage; json: string }>({ max: 500, maxSize: 32 * 1024 * 1024, sizeCalculation: (e) => e.json.length });
const counts = new LRUCache<string, { count: number; waitingCount: number }>({ max: 2000 });

export interface ListViewer {
  teamId: number;
  userId: number;
  role: Role;
}

const teamState = (db: Db, viewer: ListViewer) => {
  const team = teamListState(db, viewer.teamId);
  return { version: team.listVersion, reviewsUnnamed: mayReview(viewer.role, team) };
};

/** One page of the list, as the object and as the JSON text the API sends. */
export function designsListPage(db: Db, viewer: ListViewer, query: DesignListQuery, state = teamState(db, viewer)): { page: DesignPage; json: string } {
  const { version, reviewsUnnamed } = state;
  // Only "waiting for me" depends on who asks; every other page is the same for the whole team.
  const who = query.waiting === 'me' ? `${viewer.userId}:${reviewsUnnamed}` : '';
  const key = `${viewer.teamId}:${version}:${who}:${JSON.stringify(query)}`;
  let entry = pages.get(key);
  if (entry === undefined) {
    const page = listDesignsPage(db, viewer.teamId, query, { userId: viewer.userId, reviewsUnnamed });
    entry = { page, json: JSON.stringify(page) };
    pages.set(key, entry);
  }
  return entry;
}

/** The list page as JSON text (GET /api/designs). */
export const designsListJson = (db: Db, viewer: ListViewer, query: DesignListQuery): string => designsListPage(db, viewer, query).json;

/**
 * What the designs page shows: one page of the list, the team's number of designs and how many
 * wait for this viewer's review (header and tabs), from one read of the team's version.
 */
export function designsListView(db: Db, viewer: ListViewer, query: DesignListQuery): { page: DesignPage; count: number; waitingCount: number; reviewsUnnamed: boolean } {
  const state = teamState(db, viewer);
  const key = `${viewer.teamId}:${state.version}:${viewer.userId}:${state.reviewsUnnamed}`;
  let entry = counts.get(key);
  if (entry === undefined) {
    entry = { count: countDesigns(db, viewer.teamId), waitingCount: countDesignsWaitingFor(db, viewer.teamId, viewer.userId, state.reviewsUnnamed) };
    counts.set(key, entry);
  }
  return { page: designsListPage(db, viewer, query, state).page, ...entry, reviewsUnnamed: state.reviewsUnnamed };
}
