import { NextResponse, type NextRequest } from 'next/server';
import { contentSecurityPolicy } from '@/lib/csp';

/**
 * Every page gets a fresh script nonce and the content security policy that names it
 * (lib/csp.ts): Next reads the policy from the request and puts the nonce on its own bootstrap
 * and data scripts, so script-src needs no 'unsafe-inline'. API routes and static files are not
 * matched (next.config.mjs gives them their headers).
 */
export function proxy(request: NextRequest) {
  const nonce = btoa(String.fromCharCode(...crypto.getRandomValues(new Uint8Array(16))));
  const policy = contentSecurityPolicy(nonce, process.env.NODE_ENV === 'development');
  const headers = new Headers(request.headers);
  headers.set('content-security-policy', policy);
  const response = NextResponse.next({ request: { headers } });
  response.headers.set('content-security-policy', policy);
  return response;
}

export const config = {
  matcher: [{ source: '/((?!api/|_next/static|_next/image|favicon.ico|icon.svg).*)' }],
};
