/**
 * Builds (when stale) and serves the real app for API and browser tests:
 * `next start` on a free port with a throw-away database seeded with the
 * demo data. Build output goes to .next-test so a developer's .next is untouched.
 */
import { spawn, spawnSync, type ChildProcess } from 'node:child_process';
import fs from 'node:fs';
import net from 'node:net';
import os from 'node:os';
import path from 'node:path';

const ROOT = path.resolve(__dirname, '../..');
const DIST = '.next-test';
const SOURCES = ['app', 'components', 'lib', 'db', 'instrumentation.ts', 'proxy.ts', 'next.config.mjs', 'tailwind.config.ts', 'package.json'];

function newestMtime(p: string): number {
  const full = path.join(ROOT, p);
  if (!fs.existsSync(full)) return 0;
  const st = fs.statSync(full);
  if (!st.isDirectory()) return st.mtimeMs;
  let max = st.mtimeMs;
  for (const e of fs.readdirSync(full)) max = Math.max(max, newestMtime(path.join(p, e)));
  return max;
}

/**
 * Build unless .next-test holds a build newer than every source file. In CI (a clean clone)
 * the API tests build once and the browser tests reuse that build.
 */
export function buildIfStale() {
  const buildId = path.join(ROOT, DIST, 'BUILD_ID');
  const built = fs.existsSync(buildId) ? fs.statSync(buildId).mtimeMs : 0;
  const newest = Math.max(...SOURCES.map(newestMtime));
  if (built > newest) return precompressStatic();
  console.log('[app-server] building the app for tests (next build)…');
  const r = spawnSync('npx', ['next', 'build'], {
    cwd: ROOT,
    env: { ...process.env, NEXT_DIST_DIR: DIST, NEXT_TELEMETRY_DISABLED: '1' },
    stdio: ['ignore', 'pipe', 'pipe'],
    encoding: 'utf8',
  });
  if (r.status !== 0) throw new Error(`next build failed:\n${r.stdout}\n${r.stderr}`);
  precompressStatic();
}

/** The static files' .br/.gz, as `npm run build` writes them (scripts/precompress.mjs); skips done ones. */
export function precompressStatic() {
  const r = spawnSync(process.execPath, ['scripts/precompress.mjs'], { cwd: ROOT, env: { ...process.env, NEXT_DIST_DIR: DIST }, encoding: 'utf8' });
  if (r.status !== 0) throw new Error(`precompress failed:\n${r.stdout}\n${r.stderr}`);
}

export function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const srv = net.createServer();
    srv.listen(0, '127.0.0.1', () => {
      const { port } = srv.address() as net.AddressInfo;
      srv.close(() => resolve(port));
    });
    srv.on('error', reject);
  });
}

export interface RunningApp {
  baseUrl: string;
  dbPath: string;
  smtpPort: number;
  /** The server process (for memory readings in /proc). */
  pid: number;
  stop: () => Promise<void>;
}

/** Start the production server (scripts/serve.mjs, as `npm start`) on a fresh seeded database; resolves when it answers. */
export async function startApp(extraEnv: Record<string, string> = {}, beforeStart?: (dir: string) => void): Promise<RunningApp> {
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'phasewright-test-'));
  beforeStart?.(dir);
  const dbPath = path.join(dir, 'test.db');
  const port = await freePort();
  const smtpPort = Number(extraEnv.SMTP_PORT ?? (await freePort()));
  const env = {
    ...process.env,
    NEXT_DIST_DIR: DIST,
    NEXT_TELEMETRY_DISABLED: '1',
    DATABASE_URL: `file:${dbPath}`,
    PHASEWRIGHT_DEMO: '1',
    NEXTAUTH_SECRET: 'test-secret-not-for-production',
    SMTP_PORT: String(smtpPort),
    PORT: String(port),
    // Links in mail point here (never at a request's Host header).
    PHASEWRIGHT_PUBLIC_URL: `http://127.0.0.1:${port}`,
    // Test-only allowance: every test file signs in from 127.0.0.1, and some fail on purpose;
    // the limits themselves are tried on a server of their own (tests/api/signin-limits.test.ts).
    PHASEWRIGHT_SIGNIN_MAX_FAILS_PER_IP: '100000',
    PHASEWRIGHT_SIGNIN_MAX_FAILS_PER_ACCOUNT: '100000',
    HOST: '127.0.0.1',
    ...extraEnv,
  };
  const child: ChildProcess = spawn(process.execPath, ['scripts/serve.mjs'], {
    cwd: ROOT,
    env,
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  let log = '';
  child.stdout?.on('data', (d) => (log += d));
  child.stderr?.on('data', (d) => (log += d));
  const baseUrl = `http://127.0.0.1:${port}`;
  const deadline = Date.now() + 60_000;
  for (;;) {
    if (child.exitCode !== null) throw new Error(`the server exited early:\n${log}`);
    try {
      const res = await fetch(`${baseUrl}/api/auth/csrf`);
      if (res.ok) break;
    } catch {
      /* not up yet */
    }
    if (Date.now() > deadline) throw new Error(`the server did not answer within 60 s:\n${log}`);
    await new Promise((r) => setTimeout(r, 250));
  }
  return {
    baseUrl,
    dbPath,
    smtpPort,
    pid: child.pid ?? 0,
    stop: async () => {
      child.kill('SIGTERM');
      await new Promise((r) => setTimeout(r, 200));
      fs.rmSync(dir, { recursive: true, force: true });
    },
  };
}
