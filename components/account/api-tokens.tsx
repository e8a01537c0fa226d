'use client';

import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { useState } from 'react';
import { useForm } from 'react-hook-form';

export interface TokenRow {
  id: number;
  name: string;
  prefix: string;
  createdAt: string;
  lastUsedAt: string | null;
}

async function call<T>(url: string, init?: RequestInit): Promise<T> {
  const res = await fetch(url, { ...init, headers: { 'content-type': 'application/json', ...init?.headers } });
  const body = (await res.json().catch(() => ({}))) as T & { error?: string; issues?: { message: string }[] };
  if (!res.ok) throw new Error(body.issues?.[0]?.message ?? body.error ?? `Request failed (${res.status})`);
  return body;
}

/** Personal API tokens: create (shown once), list, revoke. */
export function ApiTokens({ initial }: { initial: TokenRow[] }) {
  const qc = useQueryClient();
  const tokens = useQuery({
    queryKey: ['api-tokens'],
    queryFn: () => call<{ tokens: TokenRow[] }>('/api/account/tokens').then((b) => b.tokens),
    initialData: initial,
  });
  const [shown, setShown] = useState<string | null>(null);
  const form = useForm<{ name: string }>({ defaultValues: { name: '' } });
  const create = useMutation({
    mutationFn: (name: string) => call<{ token: string }>('/api/account/tokens', { method: 'POST', body: JSON.stringify({ name }) }),
    onSuccess: (b) => {
      setShown(b.token);
      form.reset();
      void qc.invalidateQueries({ queryKey: ['api-tokens'] });
    },
  });
  const revoke = useMutation({
    mutationFn: (id: number) => call(`/api/account/tokens/${id}`, { method: 'DELETE' }),
    onSuccess: () => qc.invalidateQueries({ queryKey: ['api-tokens'] }),
  });
  return (
    <section className="card space-y-3 p-4" data-testid="api-tokens">
      <h2 className="font-semibold">Personal API tokens</h2>
      <p className="text-sm text-slate-600">
        A token acts as you, with your role, from scripts: <code className="font-mono text-xs">Authorization: Bearer &lt;token&gt;</code>. We keep only a
        fingerprint of it, so it is shown once.
      </p>
      <form className="flex gap-2" onSubmit={form.handleSubmit((v) => create.mutate(v.name))}>
        <label className="sr-only" htmlFor="token-name">
          Token name
        </label>
        <input id="token-name" className="input" placeholder="e.g. bench script" {...form.register('name', { required: 'give the token a name' })} />
        <button type="submit" className="btn-primary" disabled={create.isPending}>
          Create token
        </button>
      </form>
      {(form.formState.errors.name || create.isError) && (
        <p role="alert" className="text-sm text-red-700">
          {form.formState.errors.name?.message ?? create.error?.message}
        </p>
      )}
      {shown && (
        <div className="rounded-md bg-amber-50 p-3 text-sm" data-testid="new-token">
          <p className="font-medium">Copy it now; it will not be shown again.</p>
          <code className="block break-all font-mono text-xs">{shown}</code>
        </div>
      )}
      <ul className="divide-y divide-slate-100 text-sm">
        {tokens.data.map((t) => (
          <li key={t.id} className="flex items-center gap-2 py-2">
            <span className="font-medium">{t.name}</span>
            <code className="font-mono text-xs text-slate-500">{t.prefix}…</code>
            <span className="text-xs text-slate-500">{t.lastUsedAt ? `used ${t.lastUsedAt.slice(0, 16).replace('T', ' ')}` : 'never used'}</span>
            <button type="button" className="btn-secondary ml-auto" disabled={revoke.isPending} onClick={() => revoke.mutate(t.id)}>
              Revoke
            </button>
          </li>
        ))}
        {tokens.data.length === 0 && <li className="py-2 text-slate-500">No tokens yet.</li>}
      </ul>
    </section>
  );
}
