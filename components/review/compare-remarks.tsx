'use client';

import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { z } from 'zod';
import { formatDateTime } from '@/lib/format';
import { addRemark } from '@/lib/queries/review';
import { remarkSchema } from '@/lib/validation/signoff';
import { Button } from '@/components/ui/button';
import { Field, FormError, inputClass } from '@/components/ui/field';
import { useReviewWrite } from './use-review-write';

export interface CompareRemark {
  id: number;
  number: number;
  authorName: string;
  body: string;
  comparedWith: number | null;
  at: string;
}

/** The shared remark schema plus which of the two revisions the remark is on. */
const formSchema = remarkSchema.pick({ body: true }).extend({ target: z.enum(['a', 'b']) });
type FormValues = z.input<typeof formSchema>;
const FIELDS = ['body', 'target'] as const;

/**
 * Remarks written while comparing two revisions: on either side (B by default), kept with
 * that revision and mailed to its author and reviewer. Earlier remarks of both are listed.
 */
export function CompareRemarks({ designId, a, b, remarks, canRemark }: { designId: number; a: number; b: number; remarks: CompareRemark[]; canRemark: boolean }) {
  const form = useForm<FormValues, unknown, z.output<typeof formSchema>>({ resolver: zodResolver(formSchema), defaultValues: { target: 'b', body: '' } });
  // Remarks written here show at once; the page's refresh (which recomputes both worst cases,
  // seconds on a busy server) brings the same rows from the server.
  const [added, setAdded] = useState<CompareRemark[]>([]);
  const post = useReviewWrite(
    form,
    FIELDS,
    async (v: z.output<typeof formSchema>) => {
      const [number, other] = v.target === 'b' ? [b, a] : [a, b];
      return { number, row: await addRemark(designId, number, { body: v.body, comparedWith: other }) };
    },
    ({ number, row }) => {
      setAdded((list) => [...list, { id: row.id, number, authorName: row.authorName, body: row.body, comparedWith: row.comparedWith, at: row.createdAt }]);
      form.reset({ target: form.getValues('target'), body: '' });
    },
  );
  const shown = [...remarks, ...added.filter((m) => !remarks.some((r) => r.id === m.id))];
  const error = form.formState.errors.body?.message;

  return (
    <section className="card p-4" aria-labelledby="compare-remarks-heading" data-testid="compare-remarks">
      <h2 id="compare-remarks-heading" className="font-semibold">
        Remarks on r{a} and r{b}
      </h2>
      <ol className="mt-2 space-y-2" data-testid="compare-remark-list">
        {shown.length === 0 && <li className="text-sm text-slate-500">No remarks on either revision yet.</li>}
        {shown.map((m) => (
          <li key={m.id} className="rounded-md border border-slate-200 px-3 py-2 text-sm">
            <div className="flex flex-wrap items-baseline gap-x-2 text-xs text-slate-500">
              <span className="font-medium text-slate-800">{m.authorName}</span>
              <span>
                on r{m.number}
                {m.comparedWith ? ` (comparing with r${m.comparedWith})` : ''}
              </span>
              <span className="num ml-auto">{formatDateTime(m.at)}</span>
            </div>
            <p className="mt-1 whitespace-pre-wrap text-slate-800">{m.body}</p>
          </li>
        ))}
      </ol>
      {canRemark && a !== b && (
        <form className="mt-3 space-y-2" aria-label="Remark on this comparison" onSubmit={form.handleSubmit((v) => post.mutate(v))} noValidate>
          <div className="flex flex-wrap items-center gap-3 text-sm">
            <span className="label mb-0">Remark on</span>
            <label className="inline-flex items-center gap-1">
              <input type="radio" value="b" {...form.register('target')} /> r{b} (B)
            </label>
            <label className="inline-flex items-center gap-1">
              <input type="radio" value="a" {...form.register('target')} /> r{a} (A)
            </label>
            <span className="text-xs text-slate-500">Its author and reviewer get it by mail.</span>
          </div>
          <Field label="Remark" htmlFor="compare-remark" error={error}>
            <textarea id="compare-remark" className={inputClass(error, 'min-h-[60px]')} {...form.register('body')} />
          </Field>
          <FormError message={form.formState.errors.root?.message} />
          <Button type="submit" disabled={post.isPending}>
            Add remark
          </Button>
        </form>
      )}
    </section>
  );
}
