import 'server-only';
import { RateLimiterMemory, RateLimiterRes } from 'rate-limiter-flexible';

/**
 * Limits on failed sign-ins, per account (e-mail) and per client address,
 * with rate-limiter-flexible. Every attempt takes a point first (so parallel
 * attempts cannot slip past); a successful sign-in gives the address's point
 * back and clears the account's count. Settings (environment):
 *   PHASEWRIGHT_SIGNIN_MAX_FAILS_PER_ACCOUNT  default 10
 *   PHASEWRIGHT_SIGNIN_MAX_FAILS_PER_IP       default 50
 *   PHASEWRIGHT_SIGNIN_WINDOW_SECONDS         default 900 (the count's lifetime and the lock-out)
 *   PHASEWRIGHT_TRUST_PROXY=1                 take the client address from X-Forwarded-For's first entry
 * Kept in memory: one server process (as Phasewright runs) shares one count.
 */

function envInt(name: string, fallback: number) {
  const n = Number(process.env[name]);
  return Number.isInteger(n) && n > 0 ? n : fallback;
}

let limiters: { account: RateLimiterMemory; address: RateLimiterMemory } | null = null;
function get() {
  if (!limiters) {
    const duration = envInt('PHASEWRIGHT_SIGNIN_WINDOW_SECONDS', 900);
    limiters = {
      account: new RateLimiterMemory({ keyPrefix: 'acct', points: envInt('PHASEWRIGHT_SIGNIN_MAX_FAILS_PER_ACCOUNT', 10), duration, blockDuration: duration }),
      address: new RateLimiterMemory({ keyPrefix: 'addr', points: envInt('PHASEWRIGHT_SIGNIN_MAX_FAILS_PER_IP', 50), duration, blockDuration: duration }),
    };
  }
  return limiters;
}

/** The client's address as far as the server can tell (see PHASEWRIGHT_TRUST_PROXY). */
export function clientAddress(headers: Headers): string {
  const forwarded = (headers.get('x-forwarded-for') ?? '').split(',').map((s) => s.trim()).filter(Boolean);
  if (process.env.PHASEWRIGHT_TRUST_PROXY === '1' && forwarded.length) return forwarded[0];
  return forwarded.at(-1) ?? headers.get('x-real-ip') ?? 'unknown';
}

export type Attempt = { ok: true; succeeded: () => Promise<void> } | { ok: false; retryAfterSeconds: number };

/** Take a point for an attempt; refused when the account or the address is over its limit. */
export async function beginSignIn(email: string, address: string): Promise<Attempt> {
  const { account, address: byAddress } = get();
  const accountKey = email.trim().toLowerCase();
  try {
    await Promise.all([account.consume(accountKey), byAddress.consume(address)]);
  } catch (err) {
    if (err instanceof RateLimiterRes) return { ok: false, retryAfterSeconds: Math.max(1, Math.ceil(err.msBeforeNext / 1000)) };
    if (err instanceof Error) throw err;
    return { ok: false, retryAfterSeconds: 1 };
  }
  return {
    ok: true,
    succeeded: async () => {
      await Promise.all([account.delete(accountKey), byAddress.reward(address, 1)]);
    },
  };
}
