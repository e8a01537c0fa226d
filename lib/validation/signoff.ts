import { z } from 'zod';

const message = z.string({ error: 'message must be text' }).trim().max(4000, 'message must be at most 4000 characters');

export const submitForReviewSchema = z.object({
  /** The reviewer who must decide; null or absent leaves it to any reviewer of the team. */
  reviewerId: z
    .number({ error: 'reviewerId must be the id of a reviewer, or null for any reviewer' })
    .int('reviewerId must be the id of a reviewer')
    .positive('reviewerId must be the id of a reviewer')
    .nullable()
    .default(null),
  message: message.default(''),
});

export const DECISIONS = ['approve', 'request-changes'] as const;

export const decisionSchema = z.object({
  decision: z.enum(DECISIONS, { error: 'decision must be "approve" or "request-changes"' }),
  message: message.default(''),
});

export const remarkSchema = z.object({
  body: z
    .string({ error: 'body must be text' })
    .trim()
    .min(1, 'body must not be empty')
    .max(4000, 'body must be at most 4000 characters'),
  /** Written on Compare: the other revision on the plot. */
  comparedWith: z.number({ error: 'comparedWith must be a revision number' }).int().positive().optional(),
});

export type SubmitForReview = z.infer<typeof submitForReviewSchema>;
export type DecisionInput = z.infer<typeof decisionSchema>;
export type RemarkInput = z.infer<typeof remarkSchema>;
