import { LRUCache } from 'lru-cache';
import type { Db } from '@/db/connection';
import { listDesignsPage, teamListState } from '@/db/queries';
import type { DesignListQuery } from '@/lib/designs-list-query';
import { mayReview } from '@/lib/signoff-policy';
import type { Role } from '@/lib/catalog';

/**
 * Serialized pages of the designs list, keyed by the team's list version: triggers bump it on
 * every change the list shows (migration team_list_version_triggers), so a cached page is never
 * stale, and a team that reloads its list (the page, refetch on focus, scripts) reads one row
 * instead of a page of designs. Per process; bounded by count and size.
 */
const pages = new LRUCache<string, string>({ max: 500, maxSize: 32 * 1024 * 1024, sizeCalculation: (body) => body.length });

/** The list page as JSON text, from the cache when the team's list has not changed since. */
export function designsListJson(db: Db, viewer: { teamId: number; userId: number; role: Role }, query: DesignListQuery): string {
  const team = teamListState(db, viewer.teamId);
  const reviewsUnnamed = mayReview(viewer.role, team);
  // Only "waiting for me" depends on who asks; every other page is the same for the whole team.
  const who = query.waiting === 'me' ? `${viewer.userId}:${reviewsUnnamed}` : '';
  const key = `${viewer.teamId}:${team.listVersion}:${who}:${JSON.stringify(query)}`;
  let body = pages.get(key);
  if (body === undefined) {
    body = JSON.stringify(listDesignsPage(db, viewer.teamId, query, { userId: viewer.userId, reviewsUnnamed }));
    pages.set(key, body);
  }
  return body;
}
