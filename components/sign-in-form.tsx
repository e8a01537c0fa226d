'use client';

import { signIn } from 'next-auth/react';
import { useForm } from 'react-hook-form';
import { signInFormRules, type SignInFields } from '@/lib/validation/sign-in-rules';
import { Button } from '@/components/ui/button';
import { Field, FormError, inputClass } from '@/components/ui/field';

/**
 * Email and password through next-auth's credentials provider, which checks the same rules with
 * zod on the server. A wrong pair never says which of the two was wrong.
 */
export function SignInForm({ callbackUrl }: { callbackUrl: string }) {
  const form = useForm<SignInFields>({ defaultValues: { email: '', password: '' } });
  const { errors, isSubmitting } = form.formState;

  const onSubmit = form.handleSubmit(async ({ email, password }) => {
    const res = await signIn('credentials', { email, password, redirect: false }).catch(() => null);
    if (res?.status === 429 || res?.error === 'TooManyAttempts')
      return form.setError('root', { message: 'Too many failed sign-ins for this account or from this network. Wait a few minutes, then try again.' });
    if (!res) return form.setError('root', { message: 'The server could not be reached; check the connection and try again.' });
    if (res.error) return form.setError('root', { message: 'That email and password do not match an account.' });
    window.location.assign(callbackUrl);
  });

  return (
    <form onSubmit={onSubmit} className="space-y-4" noValidate>
      <Field label="Email" htmlFor="email" error={errors.email?.message}>
        <input id="email" type="email" autoComplete="username" className={inputClass(errors.email?.message)} aria-invalid={!!errors.email} {...form.register('email', signInFormRules.email)} />
      </Field>
      <Field label="Password" htmlFor="password" error={errors.password?.message}>
        <input id="password" type="password" autoComplete="current-password" className={inputClass(errors.password?.message)} aria-invalid={!!errors.password} {...form.register('password', signInFormRules.password)} />
      </Field>
      <FormError message={errors.root?.message} testId="signin-error" />
      <Button type="submit" variant="primary" className="w-full justify-center" disabled={isSubmitting}>
        {isSubmitting ? 'Signing in…' : 'Sign in'}
      </Button>
    </form>
  );
}
