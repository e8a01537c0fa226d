'use client';

import { zodResolver } from '@hookform/resolvers/zod';
import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import type { z } from 'zod';
import { formatIsoMinute } from '@/lib/format';
import { apiTokensQueryOptions, createApiTokenRequest, revokeApiTokenRequest, type ApiTokenRow } from '@/lib/queries/account';
import { showServerErrors } from '@/lib/queries/request';
import { apiTokenCreateSchema } from '@/lib/validation/account';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { FormError, inputClass } from '@/components/ui/field';

type Fields = z.input<typeof apiTokenCreateSchema>;

/** Personal API tokens: create (shown once), list, revoke. */
export function ApiTokens({ initial }: { initial: ApiTokenRow[] }) {
  const qc = useQueryClient();
  const tokens = useQuery({ ...apiTokensQueryOptions(), initialData: initial });
  const [shown, setShown] = useState<string | null>(null);
  const form = useForm<Fields, unknown, z.output<typeof apiTokenCreateSchema>>({ resolver: zodResolver(apiTokenCreateSchema), defaultValues: { name: '' } });
  const create = useMutation({
    mutationFn: createApiTokenRequest,
    onSuccess: (b) => {
      setShown(b.token);
      form.reset();
      void qc.invalidateQueries({ queryKey: apiTokensQueryOptions().queryKey });
    },
    onError: (err) => showServerErrors(err, ['name'] as const, form.setError),
  });
  const revoke = useMutation({
    mutationFn: revokeApiTokenRequest,
    onSuccess: () => qc.invalidateQueries({ queryKey: apiTokensQueryOptions().queryKey }),
  });
  const nameError = form.formState.errors.name?.message;
  return (
    <Card title="Personal API tokens" testId="api-tokens">
      <div className="space-y-3">
        <p className="text-sm text-slate-600">
          A token acts as you, with your role, from scripts: <code className="font-mono text-xs">Authorization: Bearer &lt;token&gt;</code>. We keep only a
          fingerprint of it, so it is shown once.
        </p>
        <form className="flex gap-2" onSubmit={form.handleSubmit((v) => create.mutate(v))} noValidate>
          <label className="sr-only" htmlFor="token-name">
            Token name
          </label>
          <input id="token-name" className={inputClass(nameError)} placeholder="e.g. bench script" aria-invalid={!!nameError} {...form.register('name')} />
          <Button type="submit" variant="primary" className="shrink-0" disabled={create.isPending}>
            Create token
          </Button>
        </form>
        {nameError && (
          <p role="alert" className="field-error" id="token-name-error">
            {nameError}
          </p>
        )}
        <FormError message={form.formState.errors.root?.message ?? (revoke.isError ? revoke.error.message : null)} />
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
              <span className="text-xs text-slate-500">{t.lastUsedAt ? `used ${formatIsoMinute(t.lastUsedAt)}` : 'never used'}</span>
              <Button className="ml-auto" disabled={revoke.isPending} onClick={() => revoke.mutate(t.id)}>
                Revoke
              </Button>
            </li>
          ))}
          {tokens.data.length === 0 && <li className="py-2 text-slate-500">No tokens yet.</li>}
        </ul>
      </div>
    </Card>
  );
}
