/**
 * `npm run create-admin`, the first step of a real deployment, on a fresh
 * database with the Node that runs the tests (it used to fail on Node 20:
 * top-level await in CommonJS output). The password comes on stdin, never argv.
 */
import { spawn, spawnSync } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { openDatabase } from '@/db/connection';
import { getUserByEmail, listTeamsForUser, verifyCredentials } from '@/db/queries';

const ROOT = path.resolve(__dirname, '../..');

function run(args: string[], stdin: string, dbFile: string) {
  return spawnSync('npm', ['run', '-s', 'create-admin', '--', ...args], {
    cwd: ROOT,
    input: stdin,
    encoding: 'utf8',
    env: { ...process.env, DATABASE_URL: dbFile, PHASEWRIGHT_ADMIN_PASSWORD: '' },
    timeout: 60_000,
  });
}

/** The same script without npm's start-up, so the refusals can run side by side. */
function runDirect(args: string[], stdin: string, dbFile: string): Promise<{ status: number | null; stderr: string }> {
  return new Promise((resolve, reject) => {
    const child = spawn(path.join(ROOT, 'node_modules/.bin/tsx'), ['db/create-admin-cli.ts', ...args], {
      cwd: ROOT,
      env: { ...process.env, DATABASE_URL: dbFile, PHASEWRIGHT_ADMIN_PASSWORD: '' },
    });
    let stderr = '';
    child.stderr.on('data', (c) => (stderr += c));
    child.on('error', reject);
    child.on('close', (status) => resolve({ status, stderr }));
    child.stdin.end(stdin);
  });
}

describe('npm run create-admin', () => {
  it(`creates the first admin and team on a fresh database (Node ${process.version}), password from stdin`, async () => {
    const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'pw-admin-'));
    const dbFile = path.join(dir, 'data', 'phasewright.db');
    try {
      const r = run(['--email', 'First@Company.test', '--name', 'First Admin', '--team', 'Power team'], 'a strong password\n', dbFile);
      expect(r.status, r.stderr).toBe(0);
      expect(r.stdout).toContain('Created admin first@company.test of team "Power team"');
      expect(fs.statSync(dbFile).mode & 0o777).toBe(0o600);
      const db = openDatabase(dbFile);
      const user = getUserByEmail(db, 'first@company.test')!;
      expect(listTeamsForUser(db, user.id)).toMatchObject([{ teamName: 'Power team', role: 'admin' }]);
      expect(verifyCredentials(db, 'first@company.test', 'a strong password')).toBeTruthy();
      db.$client.close();
      // a second run for the same address refuses; a short password is refused
      const [again, short] = await Promise.all([
        runDirect(['--email', 'first@company.test', '--name', 'X', '--team', 'T'], 'a strong password\n', dbFile),
        runDirect(['--email', 'b@company.test', '--name', 'B', '--team', 'T'], 'short\n', dbFile),
      ]);
      expect(again.status, again.stderr).toBe(1);
      expect(short.status).toBe(2);
      expect(short.stderr).toContain('at least 8 characters');
    } finally {
      fs.rmSync(dir, { recursive: true, force: true });
    }
  });
});
