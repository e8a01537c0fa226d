import { describe, expect, it } from 'vitest';
import { describeAudit } from '@/lib/audit-text';

describe('describeAudit', () => {
  it.each([
    [{ action: 'revision.saved', entityType: 'revision', entityId: 9, detail: { designId: 2, number: 3 } }, 'saved r3 of design #2'],
    [{ action: 'member.added', entityType: 'user', entityId: 4, detail: { email: 'a@b.test', role: 'viewer' } }, 'added a@b.test as viewer'],
    [{ action: 'signoff.changes-requested', entityType: 'revision', entityId: 9, detail: { number: 2 } }, 'set r2 to changes requested'],
    [{ action: 'something.new', entityType: 'thing', entityId: 1, detail: {} }, 'something.new thing #1'],
  ])('%#', (entry, text) => expect(describeAudit(entry)).toBe(text));
});
