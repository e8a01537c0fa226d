import { z } from 'zod';
import { PART_ORDER } from '@/lib/catalog/compensators';
import { topologySchema } from './analyze';

export { topologySchema };

export const designCreateSchema = z.object({
  name: z
    .string({ error: 'name is required' })
    .trim()
    .min(1, 'name must not be empty')
    .max(120, 'name must be at most 120 characters'),
  description: z.string().trim().max(2000, 'description must be at most 2000 characters').optional(),
  topology: topologySchema.default('buck'),
});

export const designUpdateSchema = designCreateSchema
  .omit({ topology: true })
  .partial()
  .extend({
    // partialRecord: a mapping may name only some parts (z.record with enum keys wants all).
    designatorMap: z
      .partialRecord(
        z.enum(PART_ORDER),
        z.string().trim().regex(/^[A-Za-z]{1,4}\d{1,5}[A-Za-z]?$/, 'use a reference designator such as R17 or C42'),
      )
      .optional(),
  });

export type DesignCreate = z.infer<typeof designCreateSchema>;
export type DesignUpdate = z.infer<typeof designUpdateSchema>;

/** The designs list: 100 rows a page, filtered and sorted on the server. */
export const DESIGN_PAGE_SIZE = 100;
export const DESIGN_SORTS = ['name', 'topology', 'latestRevision', 'signoffState', 'updatedAt'] as const;
export type DesignSort = (typeof DESIGN_SORTS)[number];
/** Sign-off states (as db/schema's SIGNOFF_STATES) plus 'unsaved' for a design with no revision. */
export const DESIGN_STATUSES = ['unsaved', 'draft', 'in-review', 'approved', 'changes-requested'] as const;

/**
 * GET /api/designs and the /designs page's URL: `q` (name, description or owner contains),
 * `topology`, `status`, `sort`, `dir` (default: newest first for updatedAt, else ascending),
 * `page` (from 1). Absent or empty means "all" / the default.
 */
export const designListQuerySchema = z.object({
  q: z.string().trim().max(200, 'q must be at most 200 characters').default(''),
  topology: z.enum(['all', 'buck', 'boost', 'buck-boost'], { error: 'topology must be all, buck, boost or buck-boost' }).default('all'),
  status: z.enum(['all', ...DESIGN_STATUSES], { error: `status must be all, ${DESIGN_STATUSES.join(', ')}` }).default('all'),
  sort: z.enum(DESIGN_SORTS, { error: `sort must be one of ${DESIGN_SORTS.join(', ')}` }).default('updatedAt'),
  dir: z.enum(['asc', 'desc'], { error: 'dir must be asc or desc' }).optional(),
  page: z.coerce.number({ error: 'page must be a number' }).int('page must be a whole number').min(1, 'page starts at 1').default(1),
});
export type DesignListQuery = z.infer<typeof designListQuerySchema>;

const entries = (params: URLSearchParams | Record<string, string | string[] | undefined>) => {
  const out: Record<string, string> = {};
  const it = params instanceof URLSearchParams ? params.entries() : Object.entries(params);
  for (const [k, v] of it) {
    const one = Array.isArray(v) ? v[0] : v;
    if (one !== undefined && one !== '') out[k] = one;
  }
  return out;
};

/** Strict parse for the API (400 naming the parameter). */
export function parseDesignListQuery(params: URLSearchParams | Record<string, string | string[] | undefined>) {
  return designListQuerySchema.safeParse(entries(params));
}

/** Lenient parse for the page: a parameter that does not fit falls back to its default. */
export function readDesignListQuery(params: URLSearchParams | Record<string, string | string[] | undefined>): DesignListQuery {
  const raw = entries(params);
  const r = designListQuerySchema.safeParse(raw);
  if (r.success) return r.data;
  for (const issue of r.error.issues) delete raw[String(issue.path[0])];
  return designListQuerySchema.parse(raw);
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
  return p.toString();
}
