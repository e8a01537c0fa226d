'use client';

import { zodResolver } from '@hookform/resolvers/zod';
import { useMutation } from '@tanstack/react-query';
import { useForm } from 'react-hook-form';
import type { z } from 'zod';
import { showServerErrors } from '@/lib/queries/request';
import { saveTeamSettingsRequest } from '@/lib/queries/team';
import { teamSettingsSchema } from '@/lib/validation/team-settings';
import { Card } from '@/components/ui/card';
import { FormError } from '@/components/ui/field';

type Fields = z.input<typeof teamSettingsSchema>;

/** The team's sign-off setting: may admins review (lib/signoff-policy.ts)? Saved at once. */
export function SignoffSettings({ adminsMayReview }: { adminsMayReview: boolean }) {
  const form = useForm<Fields, unknown, z.output<typeof teamSettingsSchema>>({ resolver: zodResolver(teamSettingsSchema), defaultValues: { adminsMayReview } });
  const save = useMutation({
    mutationFn: saveTeamSettingsRequest,
    onMutate: () => form.clearErrors(),
    onSuccess: (saved) => form.reset({ adminsMayReview: saved.adminsMayReview }),
    onError: (err, tried) => {
      // The box shows what is stored: back to the value before the click.
      form.reset({ adminsMayReview: !tried.adminsMayReview });
      showServerErrors(err, ['adminsMayReview'] as const, form.setError, 'Saving failed');
    },
  });
  const submit = form.handleSubmit((v) => save.mutate(v));
  const error = form.formState.errors.adminsMayReview?.message ?? form.formState.errors.root?.message;
  return (
    <Card title="Sign-off" testId="signoff-settings">
      <form onSubmit={submit} className="space-y-2">
        <label className="flex items-start gap-2 text-sm">
          <input type="checkbox" className="mt-1" disabled={save.isPending} {...form.register('adminsMayReview', { onChange: () => void submit() })} />
          <span>
            Admins may review and sign off revisions, as reviewers do.
            <span className="block text-slate-500">
              Either way, nobody decides on a revision they wrote or submitted, and a revision sent to a named reviewer waits for that reviewer.
            </span>
          </span>
        </label>
        <FormError message={error ? `${error}; the setting was not changed.` : null} />
      </form>
    </Card>
  );
}
