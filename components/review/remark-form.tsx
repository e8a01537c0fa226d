'use client';

import { zodResolver } from '@hookform/resolvers/zod';
import { useForm } from 'react-hook-form';
import type { z } from 'zod';
import { addRemark } from '@/lib/queries/review';
import { remarkSchema } from '@/lib/validation/signoff';
import { Button } from '@/components/ui/button';
import { Field, FormError, inputClass } from '@/components/ui/field';
import { useReviewWrite } from './use-review-write';

const bodyOnly = remarkSchema.pick({ body: true });
type Values = z.input<typeof bodyOnly>;
const FIELDS = ['body'] as const;

/** A remark on one revision (its author and reviewer get it by mail). */
export function RemarkForm({ designId, number }: { designId: number; number: number }) {
  const form = useForm<Values, unknown, z.output<typeof bodyOnly>>({ resolver: zodResolver(bodyOnly), defaultValues: { body: '' } });
  const post = useReviewWrite(form, FIELDS, (v: z.output<typeof bodyOnly>) => addRemark(designId, number, v), () => form.reset({ body: '' }));
  const error = form.formState.errors.body?.message;
  const empty = !form.watch('body').trim();

  return (
    <form className="space-y-2" aria-label="Add a remark" onSubmit={form.handleSubmit((v) => post.mutate(v))} noValidate>
      <Field label="Add a remark" htmlFor="remark" error={error}>
        <textarea id="remark" className={inputClass(error, 'min-h-[60px]')} {...form.register('body')} />
      </Field>
      <FormError message={form.formState.errors.root?.message} />
      <Button type="submit" disabled={post.isPending || empty}>
        Add remark
      </Button>
    </form>
  );
}
