'use client';

import { zodResolver } from '@hookform/resolvers/zod';
import { useMutation } from '@tanstack/react-query';
import { useRouter } from 'next/navigation';
import { useForm } from 'react-hook-form';
import { z } from 'zod';
import { ApiError, requestJson } from '@/lib/queries/revisions';
import { formatDate } from './format';

export interface CompareRemark {
  id: number;
  number: number;
  authorName: string;
  body: string;
  comparedWith: number | null;
  at: string;
}

const formSchema = z.object({
  target: z.enum(['a', 'b']),
  body: z.string().trim().min(1, 'Write the remark first').max(4000, 'At most 4000 characters'),
});
type FormValues = z.infer<typeof formSchema>;

/**
 * Remarks written while comparing two revisions: on either side (B by default), kept with
 * that revision and mailed to its author and reviewer. Earlier remarks of both are listed.
 */
export function CompareRemarks({ designId, a, b, remarks, canRemark }: { designId: number; a: number; b: number; remarks: CompareRemark[]; canRemark: boolean }) {
  const router = useRouter();
  const form = useForm<FormValues>({ resolver: zodResolver(formSchema), defaultValues: { target: 'b', body: '' } });
  const post = useMutation({
    mutationFn: (v: FormValues) => {
      const [number, other] = v.target === 'b' ? [b, a] : [a, b];
      return requestJson<{ mailed: number }>(`/api/designs/${designId}/revisions/${number}/remarks`, {
        method: 'POST',
        headers: { 'content-type': 'application/json' },
        body: JSON.stringify({ body: v.body, comparedWith: other }),
      });
    },
    onSuccess: () => {
      form.reset({ target: form.getValues('target'), body: '' });
      router.refresh();
    },
    onError: (e) => form.setError('body', { message: e instanceof ApiError ? e.message : 'The remark was not saved; try again' }),
  });
  const error = form.formState.errors.body?.message;

  return (
    <section className="card p-4" aria-labelledby="compare-remarks-heading" data-testid="compare-remarks">
      <h2 id="compare-remarks-heading" className="font-semibold">
        Remarks on r{a} and r{b}
      </h2>
      <ol className="mt-2 space-y-2" data-testid="compare-remark-list">
        {remarks.length === 0 && <li className="text-sm text-slate-500">No remarks on either revision yet.</li>}
        {remarks.map((m) => (
          <li key={m.id} className="rounded-md border border-slate-200 px-3 py-2 text-sm">
            <div className="flex flex-wrap items-baseline gap-x-2 text-xs text-slate-500">
              <span className="font-medium text-slate-800">{m.authorName}</span>
              <span>
                on r{m.number}
                {m.comparedWith ? ` (comparing with r${m.comparedWith})` : ''}
              </span>
              <span className="num ml-auto">{formatDate(m.at)}</span>
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
          <label className="label" htmlFor="compare-remark">
            Remark
          </label>
          <textarea id="compare-remark" className={`input min-h-[60px] ${error ? 'input-error' : ''}`} {...form.register('body')} />
          {error && (
            <p role="alert" className="field-error">
              {error}
            </p>
          )}
          <button type="submit" className="btn-secondary" disabled={post.isPending}>
            Add remark
          </button>
        </form>
      )}
    </section>
  );
}
