'use client';

import { useMutation } from '@tanstack/react-query';
import { useForm } from 'react-hook-form';

type Fields = { currentPassword: string; newPassword: string };

/** Change the password; every session ends, so we send you to sign in again. */
export function PasswordChange() {
  const form = useForm<Fields>({ defaultValues: { currentPassword: '', newPassword: '' } });
  const change = useMutation({
    mutationFn: async (v: Fields) => {
      const res = await fetch('/api/account/password', { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify(v) });
      const body = (await res.json().catch(() => ({}))) as { error?: string; issues?: { path: string; message: string }[] };
      if (!res.ok) {
        const issue = body.issues?.[0];
        if (issue && (issue.path === 'currentPassword' || issue.path === 'newPassword')) form.setError(issue.path, { message: issue.message });
        throw new Error(issue?.message ?? body.error ?? `Request failed (${res.status})`);
      }
    },
    onSuccess: () => window.location.assign('/signin'),
  });
  const err = form.formState.errors;
  return (
    <section className="card space-y-3 p-4">
      <h2 className="font-semibold">Password</h2>
      <p className="text-sm text-slate-600">Changing it signs you out everywhere, this browser included.</p>
      <form className="space-y-2" onSubmit={form.handleSubmit((v) => change.mutate(v))}>
        <label className="label" htmlFor="current-password">
          Current password
        </label>
        <input id="current-password" type="password" autoComplete="current-password" className={`input ${err.currentPassword ? 'input-error' : ''}`} {...form.register('currentPassword', { required: 'enter your current password' })} />
        {err.currentPassword && <p className="text-sm text-red-700">{err.currentPassword.message}</p>}
        <label className="label" htmlFor="new-password">
          New password (8 characters or more)
        </label>
        <input id="new-password" type="password" autoComplete="new-password" className={`input ${err.newPassword ? 'input-error' : ''}`} {...form.register('newPassword', { minLength: { value: 8, message: 'a password has at least 8 characters' } })} />
        {err.newPassword && <p className="text-sm text-red-700">{err.newPassword.message}</p>}
        <button type="submit" className="btn-primary" disabled={change.isPending}>
          Change password
        </button>
        {change.isError && !err.currentPassword && !err.newPassword && <p role="alert" className="text-sm text-red-700">{change.error.message}</p>}
      </form>
    </section>
  );
}
