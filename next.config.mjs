/**
 * Security headers on every page and route. The pages' content security policy is set per
 * request by proxy.ts (lib/csp.ts), because its script nonce changes on every request.
 */

const baseHeaders = [
  { key: 'X-Frame-Options', value: 'DENY' },
  { key: 'X-Content-Type-Options', value: 'nosniff' },
  { key: 'Referrer-Policy', value: 'same-origin' },
  { key: 'Permissions-Policy', value: 'camera=(), microphone=(), geolocation=()' },
  { key: 'Cross-Origin-Opener-Policy', value: 'same-origin' },
];

/** @type {import('next').NextConfig} */
const nextConfig = {
  // Lets several builds of one checkout coexist (tests, a second dev server).
  distDir: process.env.NEXT_DIST_DIR || '.next',
  serverExternalPackages: ['better-sqlite3'],
  allowedDevOrigins: ['127.0.0.1'],
  poweredByHeader: false,
  // `npm test` type-checks the whole project (tsc --noEmit) once; skipping it here
  // keeps builds fast on small machines and stops each distDir rewriting tsconfig.json.
  typescript: { ignoreBuildErrors: true },
  async headers() {
    // Pages get their policy from proxy.ts; API answers (JSON, and exports that set their own stricter policy) get the rest.
    return [{ source: '/:path*', headers: baseHeaders }];
  },
};

export default nextConfig;
