const dev = process.env.NODE_ENV === 'development';

/**
 * Security headers on every page and route. The content security policy
 * allows only this origin: scripts ('unsafe-inline' because the App Router's
 * bootstrap and data are inline scripts without a nonce; 'unsafe-eval' only
 * for the dev server's hot reload), styles inline (Plotly and React set style
 * attributes and inject <style>), images data:/blob: (Plotly's download
 * button), the shipped fonts from 'self'. Nothing may frame the app.
 */
const csp = [
  "default-src 'self'",
  `script-src 'self' 'unsafe-inline'${dev ? " 'unsafe-eval'" : ''}`,
  "style-src 'self' 'unsafe-inline'",
  "img-src 'self' data: blob:",
  "font-src 'self' data:",
  `connect-src 'self'${dev ? ' ws: wss:' : ''}`,
  "worker-src 'self' blob:",
  "frame-src 'self'",
  "frame-ancestors 'none'",
  "base-uri 'self'",
  "form-action 'self'",
  "object-src 'none'",
].join('; ');

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
    // Pages get the policy; API answers (JSON, and exports that set their own stricter policy) get the rest.
    return [
      { source: '/:path((?!api/).*)', headers: [{ key: 'Content-Security-Policy', value: csp }, ...baseHeaders] },
      { source: '/api/:path*', headers: baseHeaders },
    ];
  },
};

export default nextConfig;
