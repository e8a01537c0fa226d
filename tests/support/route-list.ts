/**
 * Every API route of the app, read from app/api/**\/route.ts: its URL pattern
 * and the HTTP methods it exports. Tests generated from this list cover a new
 * route without anyone adding it by hand.
 */
import fs from 'node:fs';
import path from 'node:path';

const API = path.resolve(__dirname, '../../app/api');

export interface RouteEntry {
  file: string;
  /** e.g. /api/designs/[id]/revisions */
  pattern: string;
  methods: string[];
}

export function listApiRoutes(): RouteEntry[] {
  const out: RouteEntry[] = [];
  const walk = (dir: string) => {
    for (const e of fs.readdirSync(dir, { withFileTypes: true })) {
      const full = path.join(dir, e.name);
      if (e.isDirectory()) walk(full);
      else if (e.name === 'route.ts') {
        const src = fs.readFileSync(full, 'utf8');
        const methods = [...src.matchAll(/export\s+(?:const|async\s+function|function)\s+(GET|POST|PUT|PATCH|DELETE)\b/g)].map((m) => m[1]);
        for (const m of src.matchAll(/export\s*\{([^}]*)\}/g))
          for (const part of m[1].split(',')) {
            const name = part.trim().split(/\s+as\s+/).pop();
            if (name && /^(GET|POST|PUT|PATCH|DELETE)$/.test(name)) methods.push(name);
          }
        const rel = path.relative(path.resolve(API, '..'), path.dirname(full)).split(path.sep).join('/');
        out.push({ file: path.relative(path.resolve(API, '../..'), full), pattern: `/${rel}`, methods: [...new Set(methods)] });
      }
    }
  };
  walk(API);
  return out.sort((a, b) => a.pattern.localeCompare(b.pattern));
}

export const WRITE_METHODS = ['POST', 'PUT', 'PATCH', 'DELETE'];

/** A concrete URL: every [param] replaced by `fill(name)`. */
export function concreteUrl(pattern: string, fill: (param: string) => string | number) {
  return pattern.replace(/\[\.{3}[^\]]+\]/g, 'x').replace(/\[([^\]]+)\]/g, (_m, name: string) => String(fill(name)));
}
