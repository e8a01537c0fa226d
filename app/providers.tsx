'use client';

import { QueryClientProvider } from '@tanstack/react-query';
import { getQueryClient } from '@/lib/queries/get-query-client';

// No next-auth SessionProvider: nothing reads useSession (pages get the user on the server), and
// the provider would fetch /api/auth/session on every page load. signIn/signOut work without it.
export function Providers({ children }: { children: React.ReactNode }) {
  const queryClient = getQueryClient();
  return <QueryClientProvider client={queryClient}>{children}</QueryClientProvider>;
}
