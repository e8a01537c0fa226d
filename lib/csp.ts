/**
 * The pages' content security policy. Scripts: this origin and, for the App Router's inline
 * bootstrap and data scripts, the request's nonce (proxy.ts makes one per request) — no
 * 'unsafe-inline'; 'unsafe-eval' only for the dev server's hot reload. Styles stay inline-capable
 * (Plotly injects <style> rules and React sets style attributes); images data:/blob: (Plotly's
 * download button); fonts are shipped and served from 'self'. Nothing may frame the app.
 */
export function contentSecurityPolicy(nonce: string, dev = false): string {
  return [
    "default-src 'self'",
    `script-src 'self' 'nonce-${nonce}'${dev ? " 'unsafe-eval'" : ''}`,
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
}
