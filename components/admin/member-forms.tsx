'use client';

import { zodResolver } from '@hookform/resolvers/zod';
import { useMutation } from '@tanstack/react-query';
import { useRouter } from 'next/navigation';
import { useForm } from 'react-hook-form';
import type { z } from 'zod';
import { setRoleAction } from '@/app/(app)/admin/actions';
import { ROLES } from '@/lib/catalog/roles';
import { inviteMemberRequest } from '@/lib/queries/team';
import { ApiError, showServerErrors } from '@/lib/queries/request';
import { invitationSchema } from '@/lib/validation/account';
import { setRoleSchema } from '@/lib/validation/team';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { Field, FormError, inputClass } from '@/components/ui/field';

type RoleFields = z.input<typeof setRoleSchema>;

/** A member's role, changed as soon as another is picked (the server action checks it again). */
export function RoleSelect({ userId, role, self }: { userId: number; role: (typeof ROLES)[number]; self: boolean }) {
  const form = useForm<RoleFields, unknown, z.output<typeof setRoleSchema>>({ resolver: zodResolver(setRoleSchema), defaultValues: { userId, role } });
  const change = useMutation({
    mutationFn: async (v: z.output<typeof setRoleSchema>) => {
      const answer = await setRoleAction(v);
      if (!answer.ok) throw new ApiError(422, { error: answer.error, issues: answer.issues });
      return answer;
    },
    onMutate: () => form.clearErrors(),
    onError: (err) => {
      form.reset({ userId, role });
      showServerErrors(err, ['role'] as const, form.setError);
    },
  });
  const error = form.formState.errors.role?.message ?? form.formState.errors.root?.message;
  const save = form.handleSubmit((v) => change.mutate(v));
  return (
    <form onSubmit={save} className="flex items-center gap-2">
      <select aria-label="Role" className={inputClass(error, 'w-32 py-1')} disabled={change.isPending} aria-invalid={!!error} {...form.register('role', { onChange: () => void save() })}>
        {ROLES.map((r) => (
          <option key={r} value={r}>
            {r}
          </option>
        ))}
      </select>
      {self && <span className="text-xs text-slate-400">you</span>}
      {error ? (
        <span role="alert" className="text-xs text-red-600">
          {error}
        </span>
      ) : (
        change.isSuccess && <span className="text-xs text-emerald-700">{change.data.message}</span>
      )}
    </form>
  );
}

type InviteFields = z.input<typeof invitationSchema>;
const INVITE_FIELDS = ['email', 'role'] as const;

/** Invite an address to the team: the same answer whether or not it has an account. */
export function AddMemberForm() {
  const router = useRouter();
  const form = useForm<InviteFields, unknown, z.output<typeof invitationSchema>>({ resolver: zodResolver(invitationSchema), defaultValues: { email: '', role: 'designer' } });
  const invite = useMutation({
    mutationFn: inviteMemberRequest,
    onMutate: () => form.clearErrors(),
    onSuccess: () => {
      form.reset({ email: '', role: form.getValues('role') });
      router.refresh();
    },
    onError: (err) => showServerErrors(err, INVITE_FIELDS, form.setError, 'Could not send the invitation; nothing was changed'),
  });
  const err = form.formState.errors;
  return (
    <Card title="Invite a member">
      <form onSubmit={form.handleSubmit((v) => invite.mutate(v))} className="space-y-3" noValidate>
        <p className="text-xs text-slate-500">
          We e-mail an invitation link; the person joins when they accept it (signing in, or choosing a name and password if they are new).
        </p>
        <div className="grid gap-3 sm:grid-cols-2">
          <Field label="Email" htmlFor="member-email" error={err.email?.message}>
            <input id="member-email" type="email" className={inputClass(err.email?.message)} aria-invalid={!!err.email} {...form.register('email')} />
          </Field>
          <Field label="Role" htmlFor="member-role" error={err.role?.message}>
            <select id="member-role" className={inputClass(err.role?.message)} {...form.register('role')}>
              {ROLES.map((r) => (
                <option key={r} value={r}>
                  {r}
                </option>
              ))}
            </select>
          </Field>
        </div>
        <FormError message={err.root?.message} />
        <div className="flex items-center gap-3">
          <Button type="submit" variant="primary" disabled={invite.isPending}>
            {invite.isPending ? 'Sending…' : 'Send invitation'}
          </Button>
          {invite.isSuccess && (
            <span role="status" className="text-sm text-emerald-700">
              Invitation sent to {invite.data.invited} as {invite.data.role}
            </span>
          )}
        </div>
      </form>
    </Card>
  );
}
