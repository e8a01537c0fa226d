'use client';

import { useMutation } from '@tanstack/react-query';
import { useForm } from 'react-hook-form';

type Fields = { name: string; password: string };

/** Accept: one button when signed in as the invited address; a name and password for a new account. */
export function AcceptInvitation({ token, mode, email }: { token: string; mode: 'signed-in' | 'sign-in-first' | 'new-account'; email: string }) {
  const form = useForm<Fields>({ defaultValues: { name: '', password: '' } });
  const accept = useMutation({
    mutationFn: async (v: Partial<Fields>) => {
      const res = await fetch('/api/invitations/accept', { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ token, ...v }) });
      const body = (await res.json().catch(() => ({}))) as { error?: string; issues?: { message: string }[] };
      if (!res.ok) throw new Error(body.issues?.[0]?.message ?? body.error ?? `Request failed (${res.status})`);
    },
    onSuccess: () => window.location.assign(mode === 'new-account' ? '/signin' : '/designs'),
  });
  if (mode === 'sign-in-first') {
    const back = `/invitations/accept?token=${encodeURIComponent(token)}`;
    return (
      <a className="btn-primary w-full justify-center" href={`/signin?callbackUrl=${encodeURIComponent(back)}`}>
        Sign in as {email} to accept
      </a>
    );
  }
  return (
    <form className="space-y-2" onSubmit={form.handleSubmit((v) => accept.mutate(mode === 'new-account' ? v : {}))}>
      {mode === 'new-account' && (
        <>
          <label className="label" htmlFor="invite-name">
            Your name
          </label>
          <input id="invite-name" className="input" {...form.register('name', { required: 'enter your name' })} />
          <label className="label" htmlFor="invite-password">
            Choose a password (8 characters or more)
          </label>
          <input id="invite-password" type="password" autoComplete="new-password" className="input" {...form.register('password', { minLength: { value: 8, message: 'a password has at least 8 characters' } })} />
        </>
      )}
      {(form.formState.errors.name || form.formState.errors.password || accept.isError) && (
        <p role="alert" className="text-sm text-red-700">
          {form.formState.errors.name?.message ?? form.formState.errors.password?.message ?? accept.error?.message}
        </p>
      )}
      <button type="submit" className="btn-primary w-full justify-center" disabled={accept.isPending}>
        Accept and join
      </button>
    </form>
  );
}
