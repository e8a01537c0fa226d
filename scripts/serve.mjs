#!/usr/bin/env node
/**
 * Production server (`npm start`): Next.js's own request handler, except for the build's static
 * assets, which are sent precompressed (scripts/precompress.mjs wrote `.br` / `.gz` beside them)
 * with a year-long immutable cache (their names carry a content hash). Anything without a
 * precompressed file goes to Next as usual, which compresses other responses itself.
 * PORT (default 3000) and HOST (default all interfaces) say where to listen; NEXT_DIST_DIR the build.
 */
import fs from 'node:fs';
import http from 'node:http';
import path from 'node:path';
import next from 'next';

const port = Number(process.env.PORT || 3000);
const host = process.env.HOST || undefined;
const dir = process.cwd();
const staticDir = path.join(dir, process.env.NEXT_DIST_DIR || '.next', 'static');
const TYPES = { '.js': 'application/javascript; charset=utf-8', '.css': 'text/css; charset=utf-8', '.json': 'application/json', '.svg': 'image/svg+xml', '.txt': 'text/plain; charset=utf-8' };

/** Precompressed files by path and encoding, read once (null: none on disk). */
const cache = new Map();
function precompressed(file, encoding) {
  const key = `${file}\0${encoding}`;
  if (!cache.has(key)) {
    const p = `${file}.${encoding === 'br' ? 'br' : 'gz'}`;
    cache.set(key, fs.existsSync(p) ? fs.readFileSync(p) : null);
  }
  return cache.get(key);
}

function serveStatic(req, res) {
  if (req.method !== 'GET' && req.method !== 'HEAD') return false;
  const pathname = (req.url ?? '').split('?')[0];
  if (!pathname.startsWith('/_next/static/')) return false;
  let rel;
  try {
    rel = decodeURIComponent(pathname.slice('/_next/static/'.length));
  } catch {
    return false;
  }
  const file = path.join(staticDir, rel);
  const type = TYPES[path.extname(file)];
  if (!type || !file.startsWith(staticDir + path.sep)) return false;
  const accept = String(req.headers['accept-encoding'] ?? '');
  const encoding = /\bbr\b/.test(accept) ? 'br' : /\bgzip\b/.test(accept) ? 'gzip' : null;
  const body = encoding && precompressed(file, encoding);
  if (!body) return false;
  res.writeHead(200, {
    'content-type': type,
    'content-encoding': encoding,
    'content-length': body.length,
    'cache-control': 'public, max-age=31536000, immutable',
    vary: 'Accept-Encoding',
  });
  res.end(req.method === 'HEAD' ? undefined : body);
  return true;
}

const app = next({ dev: false, dir, hostname: host ?? 'localhost', port });
const handle = app.getRequestHandler();
await app.prepare();
const server = http
  .createServer((req, res) => {
    if (!serveStatic(req, res)) void handle(req, res);
  })
  .listen(port, host, () => console.log(`› Phasewright on http://${host ?? 'localhost'}:${port}`));
// Node's 5 s keep-alive closes idle sockets just as a client reuses them ("other side closed"
// on a POST, which no client may resend). Longer than a proxy's usual 60 s idle timeout
// (common practice), so the proxy, not the app, ends idle connections; headers time out after.
server.keepAliveTimeout = 65_000;
server.headersTimeout = 66_000;
