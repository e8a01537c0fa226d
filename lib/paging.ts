/** Server-side paging of the lists that grow (revision history, remarks, mailbox): 100 a page. */
export const PAGE_SIZE = 100;

/** A `page` search parameter: a positive integer, else 1. */
export const pageParam = (v: string | string[] | undefined): number => (typeof v === 'string' && /^\d{1,9}$/.test(v) && Number(v) > 0 ? Number(v) : 1);

/** The page served (the last one when the asked page is past the end), the last page and the row offset. */
export function pageWindow(total: number, page: number, pageSize = PAGE_SIZE) {
  const lastPage = Math.max(1, Math.ceil(total / pageSize));
  const served = Math.min(Math.max(1, Math.floor(page)), lastPage);
  return { page: served, lastPage, pageSize, offset: (served - 1) * pageSize };
}
