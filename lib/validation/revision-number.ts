import { z } from 'zod';

/** A revision number typed to find or compare ("120" or "r120"): a whole number from 1 to the latest. */
export const revisionNumberField = (latest: number) =>
  z.preprocess(
    (v) => (typeof v === 'string' ? (v.trim().replace(/^r/i, '') === '' ? undefined : v.trim().replace(/^r/i, '')) : v),
    z.coerce
      .number({ error: 'Type a revision number' })
      .int('A revision number is a whole number')
      .min(1, `Revisions run r1–r${latest}`)
      .max(latest, `Revisions run r1–r${latest}`),
  );

export const revisionFindSchema = (latest: number) => z.object({ number: revisionNumberField(latest) });

export const compareJumpSchema = (latest: number) => z.object({ a: revisionNumberField(latest), b: revisionNumberField(latest) });
