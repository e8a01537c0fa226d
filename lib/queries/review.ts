import { queryOptions } from '@tanstack/react-query';
import type { z } from 'zod';
import type { RemarkPage } from '@/db/queries/remarks';
import type { Jsonified } from '@/lib/json';
import type { RemarkBody, SignoffStepBody } from '@/lib/response-bodies';
import type { decisionSchema, remarkSchema, submitForReviewSchema } from '@/lib/validation/signoff';
import { requestJson, sendJson } from './request';
import { designKeys } from './revisions';

/** Review writes (mutationFns): submit, decide, remark. Bodies are the shared schemas' input. */
const revisionUrl = (designId: number, number: number, what: 'submit' | 'decision' | 'remarks') => `/api/designs/${designId}/revisions/${number}/${what}`;

export const submitRevision = (designId: number, number: number, body: z.input<typeof submitForReviewSchema>) =>
  sendJson<Jsonified<SignoffStepBody>>(revisionUrl(designId, number, 'submit'), 'POST', body);

export const decideRevision = (designId: number, number: number, body: z.input<typeof decisionSchema>) =>
  sendJson<Jsonified<SignoffStepBody>>(revisionUrl(designId, number, 'decision'), 'POST', body);

export const addRemark = (designId: number, number: number, body: z.input<typeof remarkSchema>) =>
  sendJson<Jsonified<RemarkBody>>(revisionUrl(designId, number, 'remarks'), 'POST', body);

/** What GET …/revisions/:n/remarks?page=N answers: newest first, 100 a page. */
export type RemarkListPage = Jsonified<RemarkPage> & { pageSize: number };

export const remarkKeys = {
  revision: (designId: number, number: number) => [...designKeys.revision(designId, number), 'remarks'] as const,
  page: (designId: number, number: number, page: number) => [...designKeys.revision(designId, number), 'remarks', page] as const,
};

/** Page `page` (from 1) of revision `number`'s remarks, newest first. */
export const remarkPageQueryOptions = (designId: number, number: number, page: number) =>
  queryOptions({
    queryKey: remarkKeys.page(designId, number, page),
    queryFn: () => requestJson<RemarkListPage>(`${revisionUrl(designId, number, 'remarks')}?page=${page}`),
  });
