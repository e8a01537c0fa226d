/**
 * The designs list's URL parameters, read and written without a schema library so the list's
 * client code stays small; GET /api/designs checks the same parameters strictly with zod
 * (lib/validation/design.ts). 100 rows a page, filtered and sorted on the server.
 */
export const DESIGN_PAGE_SIZE = 100;
export const DESIGN_SORTS = ['name', 'topology', 'latestRevision', 'signoffState', 'updatedAt'] as const;
export type DesignSort = (typeof DESIGN_SORTS)[number];
/** Sign-off states (as db/schema's SIGNOFF_STATES) plus 'unsaved' for a design with no revision. */
export const DESIGN_STATUSES = ['unsaved', 'draft', 'in-review', 'approved', 'changes-requested'] as const;
const TOPOLOGIES = ['all', 'buck', 'boost', 'buck-boost'] as const;
/** Which designs by archive state: the active ones (default), the archived ones, or both. */
export const DESIGN_ARCHIVED = ['active', 'archived', 'all'] as const;

/**
 * `q` (name, description or owner contains), `topology`, `status`, `sort`, `dir` (default: newest
 * first for updatedAt, else ascending), `page` (from 1), `archived` (active | archived | all,
 * default active), `waiting=me` (latest revision waits for my sign-off). Absent or empty means
 * "all" / the default.
 */
export interface DesignListQuery {
  q: string;
  topology: (typeof TOPOLOGIES)[number];
  status: 'all' | (typeof DESIGN_STATUSES)[number];
  sort: DesignSort;
  dir?: 'asc' | 'desc';
  page: number;
  archived: (typeof DESIGN_ARCHIVED)[number];
  waiting?: 'me';
}

export type DesignListParams = URLSearchParams | Record<string, string | string[] | undefined>;

/** The non-empty parameters as plain strings (the first of repeated ones). */
export function entriesOf(params: DesignListParams): Record<string, string> {
  const out: Record<string, string> = {};
  const it: Iterable<[string, string | string[] | undefined]> = params instanceof URLSearchParams ? params.entries() : Object.entries(params);
  for (const [k, v] of it) {
    const one = Array.isArray(v) ? v[0] : v;
    if (one !== undefined && one !== '') out[k] = one;
  }
  return out;
}

const oneOf = <T extends string>(list: readonly T[], v: string | undefined, fallback: T): T => (v !== undefined && (list as readonly string[]).includes(v) ? (v as T) : fallback);

/** Lenient read for the page: a parameter that does not fit falls back to its default. */
export function readDesignListQuery(params: DesignListParams): DesignListQuery {
  const raw = entriesOf(params);
  const page = Number(raw.page);
  const q = (raw.q ?? '').trim();
  return {
    q: q.length <= 200 ? q : '',
    topology: oneOf(TOPOLOGIES, raw.topology, 'all'),
    status: oneOf(['all', ...DESIGN_STATUSES] as const, raw.status, 'all'),
    sort: oneOf(DESIGN_SORTS, raw.sort, 'updatedAt'),
    dir: raw.dir === 'asc' || raw.dir === 'desc' ? raw.dir : undefined,
    page: Number.isInteger(page) && page >= 1 ? page : 1,
    archived: oneOf(DESIGN_ARCHIVED, raw.archived, 'active'),
    waiting: raw.waiting === 'me' ? 'me' : undefined,
  };
}

export const defaultSortDir = (sort: DesignSort): 'asc' | 'desc' => (sort === 'updatedAt' ? 'desc' : 'asc');

/** The query as URL search params, leaving out defaults so the plain /designs URL stays plain. */
export function designListSearch(q: DesignListQuery): string {
  const p = new URLSearchParams();
  if (q.q) p.set('q', q.q);
  if (q.topology !== 'all') p.set('topology', q.topology);
  if (q.status !== 'all') p.set('status', q.status);
  if (q.sort !== 'updatedAt') p.set('sort', q.sort);
  if (q.dir && q.dir !== defaultSortDir(q.sort)) p.set('dir', q.dir);
  if (q.page > 1) p.set('page', String(q.page));
  if (q.archived !== 'active') p.set('archived', q.archived);
  if (q.waiting) p.set('waiting', q.waiting);
  return p.toString();
}
