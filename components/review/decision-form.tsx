'use client';

import { zodResolver } from '@hookform/resolvers/zod';
import { useForm } from 'react-hook-form';
import type { z } from 'zod';
import { decideRevision } from '@/lib/queries/review';
import { checkDecisionMessage } from '@/lib/signoff-policy';
import { decisionSchema, type DECISIONS } from '@/lib/validation/signoff';
import { Button } from '@/components/ui/button';
import { Field, FormError, inputClass } from '@/components/ui/field';
import { useReviewWrite } from './use-review-write';

const messageOnly = decisionSchema.pick({ message: true });
type Values = z.input<typeof messageOnly>;
type Decision = (typeof DECISIONS)[number];
const FIELDS = ['message'] as const;

/** Approve or request changes, with remarks (the policy asks for them when requesting changes). */
export function DecisionForm({ designId, number }: { designId: number; number: number }) {
  const form = useForm<Values, unknown, z.output<typeof messageOnly>>({ resolver: zodResolver(messageOnly), defaultValues: { message: '' } });
  const decide = useReviewWrite(form, FIELDS, (v: { decision: Decision; message: string }) => decideRevision(designId, number, v), () => form.reset({ message: '' }));
  const error = form.formState.errors.message?.message;

  const send = (decision: Decision) =>
    form.handleSubmit(({ message }) => {
      // The same rule the server applies, asked before the round trip.
      const rule = checkDecisionMessage(decision, message);
      if (!rule.ok) return form.setError('message', { message: rule.reason });
      decide.mutate({ decision, message });
    });

  return (
    <form className="space-y-2" aria-label="Decision" onSubmit={(e) => e.preventDefault()} noValidate>
      <h3 className="text-sm font-semibold">Your decision</h3>
      <Field label="Remarks with the decision (required to request changes)" htmlFor="decision-message" error={error}>
        <textarea id="decision-message" className={inputClass(error, 'min-h-[70px]')} {...form.register('message')} />
      </Field>
      <FormError message={form.formState.errors.root?.message} />
      <div className="flex gap-2">
        <Button variant="approve" disabled={decide.isPending} onClick={send('approve')}>
          Approve r{number}
        </Button>
        <Button variant="reject" disabled={decide.isPending} onClick={send('request-changes')}>
          Request changes
        </Button>
      </div>
    </form>
  );
}
