'use client';

import { zodResolver } from '@hookform/resolvers/zod';
import { useForm } from 'react-hook-form';
import type { z } from 'zod';
import { submitRevision } from '@/lib/queries/review';
import { submitForReviewSchema } from '@/lib/validation/signoff';
import { Button } from '@/components/ui/button';
import { Field, FormError, inputClass } from '@/components/ui/field';
import { useReviewWrite } from './use-review-write';

type Values = z.input<typeof submitForReviewSchema>;
const FIELDS = ['reviewerId', 'message'] as const;

/** Send a revision to a named reviewer (or to any reviewer of the team) with a message. */
export function SubmitForm({
  designId,
  number,
  again,
  reviewers,
}: {
  designId: number;
  number: number;
  /** Changes were requested: this submits the same revision again with an answer. */
  again: boolean;
  reviewers: { id: number; name: string; role: string }[];
}) {
  const start: Values = { reviewerId: reviewers[0]?.id ?? null, message: '' };
  const form = useForm<Values, unknown, z.output<typeof submitForReviewSchema>>({ resolver: zodResolver(submitForReviewSchema), defaultValues: start });
  const submit = useReviewWrite(form, FIELDS, (v: z.output<typeof submitForReviewSchema>) => submitRevision(designId, number, v), () => form.reset(start));
  const { errors } = form.formState;

  return (
    <form className="space-y-2" aria-label="Submit for review" onSubmit={form.handleSubmit((v) => submit.mutate(v))} noValidate>
      <h3 className="text-sm font-semibold">{again ? 'Submit again for review' : 'Submit for review'}</h3>
      {reviewers.length === 0 ? (
        <p className="text-sm text-slate-500">Nobody else in this team may review. An admin can add a reviewer on the Team page.</p>
      ) : (
        <>
          <Field label="Reviewer" htmlFor="reviewer" error={errors.reviewerId?.message}>
            <select id="reviewer" className={inputClass(errors.reviewerId?.message)} {...form.register('reviewerId', { setValueAs: (v) => (v === '' || v === null ? null : Number(v)) })}>
              <option value="">Any reviewer of the team</option>
              {reviewers.map((r) => (
                <option key={r.id} value={r.id}>
                  {r.name} ({r.role})
                </option>
              ))}
            </select>
          </Field>
          <Field label="Message to the reviewer" htmlFor="submit-message" error={errors.message?.message}>
            <textarea id="submit-message" className={inputClass(errors.message?.message, 'min-h-[70px]')} placeholder="What changed and what to look at" {...form.register('message')} />
          </Field>
          <FormError message={errors.root?.message} />
          <Button type="submit" variant="primary" disabled={submit.isPending}>
            {submit.isPending ? 'Submitting…' : `Submit r${number} for review`}
          </Button>
        </>
      )}
    </form>
  );
}
