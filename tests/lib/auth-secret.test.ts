import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { getAuthSecret } from '@/lib/auth-secret';

let dir: string;
const saved = { secret: process.env.NEXTAUTH_SECRET, db: process.env.DATABASE_URL };

beforeEach(() => {
  dir = fs.mkdtempSync(path.join(os.tmpdir(), 'pw-secret-'));
  delete process.env.NEXTAUTH_SECRET;
  process.env.DATABASE_URL = `file:${path.join(dir, 'app.db')}`;
});
afterEach(() => {
  process.env.NEXTAUTH_SECRET = saved.secret;
  process.env.DATABASE_URL = saved.db;
  fs.rmSync(dir, { recursive: true, force: true });
});

describe('auth secret file', () => {
  it('made on first start, owner-only, and kept', () => {
    const s = getAuthSecret();
    expect(s.length).toBeGreaterThanOrEqual(32);
    expect(fs.statSync(path.join(dir, 'auth-secret')).mode & 0o777).toBe(0o600);
    expect(getAuthSecret()).toBe(s);
  });

  it('an empty or whitespace file is replaced by a new secret', () => {
    fs.writeFileSync(path.join(dir, 'auth-secret'), '  \n');
    expect(getAuthSecret().length).toBeGreaterThanOrEqual(32);
  });

  it('a file that cannot be read is a start-up error naming it', () => {
    fs.mkdirSync(path.join(dir, 'auth-secret')); // a directory where the file should be
    expect(() => getAuthSecret()).toThrow(path.join(dir, 'auth-secret'));
  });
});
