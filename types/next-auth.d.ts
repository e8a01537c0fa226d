import type { DefaultSession } from 'next-auth';
import type { Role } from '@/db/schema';

declare module 'next-auth' {
  interface Session {
    user: DefaultSession['user'] & { id: number; teamId?: number; role?: Role };
  }
}

declare module 'next-auth/jwt' {
  interface JWT {
    userId?: number;
    /** The user's session version when the token was issued (lib/auth.ts). */
    sv?: number;
  }
}
