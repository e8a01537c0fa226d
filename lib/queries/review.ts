import type { z } from 'zod';
import type { Jsonified } from '@/lib/json';
import type { RemarkBody, SignoffStepBody } from '@/lib/response-bodies';
import type { decisionSchema, remarkSchema, submitForReviewSchema } from '@/lib/validation/signoff';
import { sendJson } from './request';

/** Review writes (mutationFns): submit, decide, remark. Bodies are the shared schemas' input. */
const revisionUrl = (designId: number, number: number, what: 'submit' | 'decision' | 'remarks') => `/api/designs/${designId}/revisions/${number}/${what}`;

export const submitRevision = (designId: number, number: number, body: z.input<typeof submitForReviewSchema>) =>
  sendJson<Jsonified<SignoffStepBody>>(revisionUrl(designId, number, 'submit'), 'POST', body);

export const decideRevision = (designId: number, number: number, body: z.input<typeof decisionSchema>) =>
  sendJson<Jsonified<SignoffStepBody>>(revisionUrl(designId, number, 'decision'), 'POST', body);

export const addRemark = (designId: number, number: number, body: z.input<typeof remarkSchema>) =>
  sendJson<Jsonified<RemarkBody>>(revisionUrl(designId, number, 'remarks'), 'POST', body);
