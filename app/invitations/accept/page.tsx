import type { Metadata } from 'next';
import { getDb } from '@/db/client';
import { findInvitation } from '@/db/queries';
import { getCurrentUser } from '@/lib/auth';
import { AcceptInvitation } from '@/components/account/accept-invitation';
import { Logo } from '@/components/ui/logo';

export const metadata: Metadata = { title: 'Invitation' };

/** The page an invitation mail links to: join the team (signing in, or creating the account). */
export default async function AcceptInvitationPage({ searchParams }: { searchParams: Promise<{ token?: string }> }) {
  const { token = '' } = await searchParams;
  const invitation = token ? findInvitation(getDb(), token) : null;
  const user = await getCurrentUser();
  return (
    <main className="flex min-h-screen items-center justify-center bg-frame-dark px-4">
      <div className="w-full max-w-sm">
        <div className="mb-6 flex justify-center text-white">
          <Logo large />
        </div>
        <div className="card space-y-3 p-6">
          {!invitation ? (
            <p className="text-sm text-slate-700">This invitation is not valid any more. Ask the team admin for a new one.</p>
          ) : (
            <>
              <h1 className="text-lg font-semibold">Join {invitation.teamName}</h1>
              <p className="text-sm text-slate-600">
                As {invitation.role}, with the address {invitation.email}.
              </p>
              <AcceptInvitation
                token={token}
                mode={invitation.hasAccount ? (user?.email === invitation.email ? 'signed-in' : 'sign-in-first') : 'new-account'}
                email={invitation.email}
              />
            </>
          )}
        </div>
      </div>
    </main>
  );
}
