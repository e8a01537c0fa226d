'use client';

import { zodResolver } from '@hookform/resolvers/zod';
import { keepPreviousData, useQuery, useQueryClient } from '@tanstack/react-query';
import { useSearchParams } from 'next/navigation';
import { useForm } from 'react-hook-form';
import { z } from 'zod';
import { formatDateTime } from '@/lib/format';
import { pageParam } from '@/lib/paging';
import { addRemark, remarkKeys, remarkPageQueryOptions, type RemarkListPage } from '@/lib/queries/review';
import { remarkSchema } from '@/lib/validation/signoff';
import { Button } from '@/components/ui/button';
import { Field, FormError, inputClass } from '@/components/ui/field';
import { Pager } from '@/components/ui/pager';
import { useReviewWrite } from './use-review-write';

/** The URL parameter holding each side's page of remarks (so Back and a shared link keep it). */
export const REMARK_PAGE_PARAM = { a: 'remarksA', b: 'remarksB' } as const;
type Side = keyof typeof REMARK_PAGE_PARAM;

/** The shared remark schema plus which of the two revisions the remark is on. */
const formSchema = remarkSchema.pick({ body: true }).extend({ target: z.enum(['a', 'b']) });
type FormValues = z.input<typeof formSchema>;
const FIELDS = ['body', 'target'] as const;

/** Put a side's remark page in the address without asking the server for the page again (Next keeps its router in step). */
function showPage(side: Side, page: number) {
  const url = new URL(window.location.href);
  if (page > 1) url.searchParams.set(REMARK_PAGE_PARAM[side], String(page));
  else url.searchParams.delete(REMARK_PAGE_PARAM[side]);
  window.history.pushState(null, '', url);
}

/** One revision's remarks, newest first, 100 a page through the remarks API. */
function RemarkList({ designId, side, number, initial }: { designId: number; side: Side; number: number; initial: RemarkListPage }) {
  const page = pageParam(useSearchParams().get(REMARK_PAGE_PARAM[side]) ?? undefined);
  const query = useQuery({
    ...remarkPageQueryOptions(designId, number, page),
    initialData: page === initial.page ? initial : undefined,
    placeholderData: keepPreviousData,
  });
  const data = query.data ?? initial;
  return (
    <div data-testid={`compare-remarks-${side}`} aria-busy={(query.isFetching && query.isPlaceholderData) || undefined}>
      <div className="flex min-h-[2.5rem] flex-wrap items-center justify-between gap-2">
        <h3 className="text-sm font-medium text-slate-600">
          On r{number} ({side.toUpperCase()})
        </h3>
        <Pager page={data.page} lastPage={data.lastPage} total={data.total} noun={`remarks on r${number}`} onPage={(p) => showPage(side, p)} testId={`compare-remarks-pager-${side}`} />
      </div>
      {/* A page is up to 100 remarks: the list scrolls in its box so the plot, the form and the diff stay near. */}
      <ol className="mt-1 max-h-[28rem] space-y-2 overflow-y-auto pr-1">
        {data.total === 0 && <li className="text-sm text-slate-500">No remarks on r{number} yet.</li>}
        {data.remarks.map((m) => (
          <li key={m.id} className="rounded-md border border-slate-200 px-3 py-2 text-sm">
            <div className="flex flex-wrap items-baseline gap-x-2 text-xs text-slate-500">
              <span className="font-medium text-slate-800">{m.authorName}</span>
              <span>
                on r{number}
                {m.comparedWith ? ` (comparing with r${m.comparedWith})` : ''}
              </span>
              <span className="num ml-auto">{formatDateTime(m.createdAt)}</span>
            </div>
            <p className="mt-1 whitespace-pre-wrap text-slate-800">{m.body}</p>
          </li>
        ))}
      </ol>
      {query.isError && <p className="text-xs text-red-700">Could not load that page of remarks; try again.</p>}
    </div>
  );
}

/**
 * Remarks written while comparing two revisions: on either side (B by default), kept with
 * that revision and mailed to its author and reviewer. Each revision's remarks are listed
 * beside the other's, newest first, 100 a page (the page in the address).
 */
export function CompareRemarks({
  designId,
  a,
  b,
  remarksA,
  remarksB,
  canRemark,
}: {
  designId: number;
  a: number;
  b: number;
  remarksA: RemarkListPage;
  remarksB: RemarkListPage;
  canRemark: boolean;
}) {
  const form = useForm<FormValues, unknown, z.output<typeof formSchema>>({ resolver: zodResolver(formSchema), defaultValues: { target: 'b', body: '' } });
  const queryClient = useQueryClient();
  const post = useReviewWrite(
    form,
    FIELDS,
    async (v: z.output<typeof formSchema>) => {
      const [number, other] = v.target === 'b' ? [b, a] : [a, b];
      return { side: v.target, number, row: await addRemark(designId, number, { body: v.body, comparedWith: other }) };
    },
    ({ side, number }) => {
      // The new remark is the newest: show that side's first page, read again.
      showPage(side, 1);
      void queryClient.invalidateQueries({ queryKey: remarkKeys.revision(designId, number) });
      form.reset({ target: form.getValues('target'), body: '' });
    },
  );
  const error = form.formState.errors.body?.message;

  return (
    <section className="card p-4" aria-labelledby="compare-remarks-heading" data-testid="compare-remarks">
      <h2 id="compare-remarks-heading" className="font-semibold">
        Remarks on r{a} and r{b}
      </h2>
      <div className={`mt-2 grid gap-4 ${a !== b ? 'md:grid-cols-2' : ''}`} data-testid="compare-remark-list">
        <RemarkList designId={designId} side="a" number={a} initial={remarksA} />
        {a !== b && <RemarkList designId={designId} side="b" number={b} initial={remarksB} />}
      </div>
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
