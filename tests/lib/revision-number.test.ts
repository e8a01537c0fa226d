import { describe, expect, it } from 'vitest';
import { revisionFindSchema } from '@/lib/validation/revision-number';

describe('a revision number typed to find or compare', () => {
  const schema = revisionFindSchema(250);
  it.each([
    ['120', 120],
    ['r120', 120],
    [' R7 ', 7],
    ['250', 250],
  ])('%j → r%d', (typed, n) => expect(schema.parse({ number: typed }).number).toBe(n));
  it.each([
    ['', 'Type a revision number'],
    ['r', 'Type a revision number'],
    ['abc', 'Type a revision number'],
    ['0', 'Revisions run r1–r250'],
    ['251', 'Revisions run r1–r250'],
    ['1.5', 'A revision number is a whole number'],
  ])('%j → "%s"', (typed, message) => {
    const r = schema.safeParse({ number: typed });
    expect(r.success).toBe(false);
    expect(r.error?.issues[0].message).toBe(message);
  });
});
