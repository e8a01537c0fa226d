'use client';

import { zodResolver } from '@hookform/resolvers/zod';
import { useRouter } from 'next/navigation';
import { useMemo } from 'react';
import { useForm } from 'react-hook-form';
import type { z } from 'zod';
import type { RevisionBriefPage } from '@/lib/queries/revisions';
import { compareJumpSchema } from '@/lib/validation/revision-number';
import { RevisionSelect } from '@/components/revisions/revision-select';
import { Button } from '@/components/ui/button';
import { inputClass } from '@/components/ui/field';

/**
 * Choose the two revisions to compare; A is drawn dashed, B solid. Each list holds one page of
 * revisions (the one holding its choice) and pages through the rest on demand; past one page,
 * both numbers may also be typed.
 */
export function ComparePicker({ designId, a, b, pageA, pageB }: { designId: number; a: number; b: number; pageA: RevisionBriefPage; pageB: RevisionBriefPage }) {
  const router = useRouter();
  const go = (na: number, nb: number) => router.push(`/designs/${designId}/compare?a=${na}&b=${nb}`);
  return (
    <div className="flex flex-wrap items-center gap-3">
      <label className="flex items-center gap-2 text-sm">
        <span className="font-medium text-slate-600">A</span>
        <RevisionSelect key={`a${a}`} designId={designId} initial={pageA} value={a} onPick={(n) => go(n, b)} label="A" testId="compare-a" />
      </label>
      <button type="button" className="btn-secondary px-2 py-1" onClick={() => go(b, a)} title="Swap A and B" aria-label="Swap A and B">
        ⇄
      </button>
      <label className="flex items-center gap-2 text-sm">
        <span className="font-medium text-slate-600">B</span>
        <RevisionSelect key={`b${b}`} designId={designId} initial={pageB} value={b} onPick={(n) => go(a, n)} label="B" testId="compare-b" />
      </label>
      {pageA.lastPage > 1 && <CompareJump key={`${a}-${b}`} latest={pageA.total} a={a} b={b} onGo={go} />}
    </div>
  );
}

/** Type both numbers (a design with more revisions than one page of the lists). */
function CompareJump({ latest, a, b, onGo }: { latest: number; a: number; b: number; onGo: (a: number, b: number) => void }) {
  const schema = useMemo(() => compareJumpSchema(latest), [latest]);
  const form = useForm<z.input<typeof schema>, unknown, z.output<typeof schema>>({ resolver: zodResolver(schema), defaultValues: { a: String(a), b: String(b) } });
  const errors = form.formState.errors;
  const error = errors.a?.message ?? errors.b?.message;
  const field = (name: 'a' | 'b') => (
    <label className="inline-flex items-center gap-1 text-xs text-slate-500">
      {name.toUpperCase()} r
      <input
        inputMode="numeric"
        className={inputClass(errors[name]?.message, 'w-20 px-2 py-0.5 text-xs')}
        aria-label={`Revision ${name.toUpperCase()} number`}
        aria-invalid={errors[name] ? true : undefined}
        data-testid={`compare-type-${name}`}
        {...form.register(name)}
      />
    </label>
  );
  return (
    <form className="flex flex-wrap items-center gap-2 border-l border-slate-200 pl-3" onSubmit={form.handleSubmit((v) => onGo(v.a, v.b))} noValidate aria-label="Type the revisions to compare">
      {field('a')}
      {field('b')}
      <Button size="sm" type="submit">
        Compare
      </Button>
      {error && (
        <span className="field-error mt-0 text-xs" role="alert" data-testid="compare-type-error">
          {error}
        </span>
      )}
    </form>
  );
}
