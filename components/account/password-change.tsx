'use client';

import { zodResolver } from '@hookform/resolvers/zod';
import { useMutation } from '@tanstack/react-query';
import { useForm } from 'react-hook-form';
import type { z } from 'zod';
import { changePasswordRequest } from '@/lib/queries/account';
import { showServerErrors } from '@/lib/queries/request';
import { passwordChangeSchema } from '@/lib/validation/account';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { Field, FormError, inputClass } from '@/components/ui/field';

type Fields = z.input<typeof passwordChangeSchema>;
const FIELDS = ['currentPassword', 'newPassword'] as const;

/** Change the password; every session ends, so we send you to sign in again. */
export function PasswordChange() {
  const form = useForm<Fields, unknown, z.output<typeof passwordChangeSchema>>({ resolver: zodResolver(passwordChangeSchema), defaultValues: { currentPassword: '', newPassword: '' } });
  const change = useMutation({
    mutationFn: changePasswordRequest,
    onSuccess: () => window.location.assign('/signin'),
    onError: (err) => showServerErrors(err, FIELDS, form.setError),
  });
  const err = form.formState.errors;
  return (
    <Card title="Password" headingLevel={2}>
      <p className="mb-3 text-sm text-slate-600">Changing it signs you out everywhere, this browser included.</p>
      <form className="space-y-3" onSubmit={form.handleSubmit((v) => change.mutate(v))} noValidate>
        <Field label="Current password" htmlFor="current-password" error={err.currentPassword?.message}>
          <input id="current-password" type="password" autoComplete="current-password" className={inputClass(err.currentPassword?.message)} {...form.register('currentPassword')} />
        </Field>
        <Field label="New password (8 characters or more)" htmlFor="new-password" error={err.newPassword?.message}>
          <input id="new-password" type="password" autoComplete="new-password" className={inputClass(err.newPassword?.message)} {...form.register('newPassword')} />
        </Field>
        <FormError message={err.root?.message} />
        <Button type="submit" variant="primary" disabled={change.isPending}>
          Change password
        </Button>
      </form>
    </Card>
  );
}
