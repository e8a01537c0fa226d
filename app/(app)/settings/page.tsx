import type { Metadata } from 'next';
import { getDb } from '@/db/client';
import { listApiTokens } from '@/db/queries';
import { requireUser } from '@/lib/auth';
import { ApiTokens } from '@/components/account/api-tokens';
import { PasswordChange } from '@/components/account/password-change';

export const metadata: Metadata = { title: 'Settings' };

/** Your account: password and personal API tokens. */
export default async function SettingsPage() {
  const user = await requireUser();
  const tokens = listApiTokens(getDb(), user.id).map((t) => ({
    id: t.id,
    name: t.name,
    prefix: t.prefix,
    createdAt: t.createdAt.toISOString(),
    lastUsedAt: t.lastUsedAt?.toISOString() ?? null,
  }));
  return (
    <div className="grid max-w-5xl gap-6 lg:grid-cols-2">
      <h1 className="text-2xl font-semibold lg:col-span-2">Settings · {user.email}</h1>
      <ApiTokens initial={tokens} />
      <PasswordChange />
    </div>
  );
}
