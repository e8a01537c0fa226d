'use client';

import { zodResolver } from '@hookform/resolvers/zod';
import { useMutation } from '@tanstack/react-query';
import { useForm } from 'react-hook-form';
import type { z } from 'zod';
import { acceptInvitationRequest } from '@/lib/queries/account';
import { showServerErrors } from '@/lib/queries/request';
import { acceptInvitationSchema } from '@/lib/validation/account';
import { Button } from '@/components/ui/button';
import { Field, FormError, inputClass } from '@/components/ui/field';

/** The new account's fields of the shared schema (the token comes from the link). */
const newAccountSchema = acceptInvitationSchema.omit({ token: true });
type Fields = z.input<typeof newAccountSchema>;
const FIELDS = ['name', 'password'] as const;

/** Accept: one button when signed in as the invited address; a name and password for a new account. */
export function AcceptInvitation({ token, mode, email }: { token: string; mode: 'signed-in' | 'sign-in-first' | 'new-account'; email: string }) {
  const form = useForm<Fields, unknown, z.output<typeof newAccountSchema>>({ resolver: zodResolver(newAccountSchema), defaultValues: { name: '', password: '' } });
  const accept = useMutation({
    mutationFn: (v: z.output<typeof newAccountSchema>) => acceptInvitationRequest({ token, ...(mode === 'new-account' ? v : {}) }),
    onSuccess: () => window.location.assign(mode === 'new-account' ? '/signin' : '/designs'),
    onError: (err) => showServerErrors(err, FIELDS, form.setError),
  });
  if (mode === 'sign-in-first') {
    const back = `/invitations/accept?token=${encodeURIComponent(token)}`;
    return (
      <a className="btn-primary w-full justify-center" href={`/signin?callbackUrl=${encodeURIComponent(back)}`}>
        Sign in as {email} to accept
      </a>
    );
  }
  const err = form.formState.errors;
  return (
    <form
      className="space-y-3"
      onSubmit={mode === 'new-account' ? form.handleSubmit((v) => accept.mutate(v)) : (e) => (e.preventDefault(), accept.mutate({}))}
      noValidate
    >
      {mode === 'new-account' && (
        <>
          <Field label="Your name" htmlFor="invite-name" error={err.name?.message}>
            <input id="invite-name" autoComplete="name" className={inputClass(err.name?.message)} {...form.register('name')} />
          </Field>
          <Field label="Choose a password (8 characters or more)" htmlFor="invite-password" error={err.password?.message}>
            <input id="invite-password" type="password" autoComplete="new-password" className={inputClass(err.password?.message)} {...form.register('password')} />
          </Field>
        </>
      )}
      <FormError message={err.root?.message} />
      <Button type="submit" variant="primary" className="w-full justify-center" disabled={accept.isPending}>
        Accept and join
      </Button>
    </form>
  );
}
