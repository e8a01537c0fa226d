import fs from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { CHECK_LABELS, checkLabel } from '@/lib/catalog';

/** Every literal check id the engine writes (`id: '…'`), read from its source. */
const engineCheckIds = () => {
  const dir = path.join(__dirname, '../../lib/engine');
  const ids = new Set<string>();
  for (const file of fs.readdirSync(dir).filter((f) => f.endsWith('.ts'))) {
    for (const m of fs.readFileSync(path.join(dir, file), 'utf8').matchAll(/\bid: '([a-z0-9-]+)'/g)) ids.add(m[1]);
  }
  return [...ids];
};

describe('check labels', () => {
  it('every check the engine can raise has a short label', () => {
    const ids = engineCheckIds();
    expect(ids.length).toBeGreaterThan(10);
    expect(ids.filter((id) => !(id in CHECK_LABELS))).toEqual([]);
  });

  it('a corner risk reads as its check; an unknown id still reads as words', () => {
    expect(checkLabel('worst-subharmonic')).toBe('Subharmonic oscillation');
    expect(checkLabel('worst-phase-margin')).toBe('Worst phase margin');
    expect(checkLabel('some-new-check')).toBe('Some new check');
  });
});
