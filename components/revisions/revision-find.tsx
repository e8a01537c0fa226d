'use client';

import { zodResolver } from '@hookform/resolvers/zod';
import { useMemo } from 'react';
import { useForm } from 'react-hook-form';
import type { z } from 'zod';
import { revisionFindSchema } from '@/lib/validation/revision-number';
import { Button } from '@/components/ui/button';
import { inputClass } from '@/components/ui/field';

/** "Find r…": shows the page of the picker that holds the number typed (it does not leave the screen). */
export function RevisionFind({ latest, onFind, idPrefix }: { latest: number; onFind: (n: number) => void; idPrefix: string }) {
  const schema = useMemo(() => revisionFindSchema(latest), [latest]);
  const form = useForm<z.input<typeof schema>, unknown, z.output<typeof schema>>({ resolver: zodResolver(schema), defaultValues: { number: '' } });
  const error = form.formState.errors.number?.message;
  const id = `${idPrefix}-find`;
  return (
    <form className="inline-flex flex-wrap items-center gap-1" onSubmit={form.handleSubmit((v) => onFind(v.number))} noValidate aria-label="Find a revision">
      <label htmlFor={id} className="text-xs text-slate-500">
        Find r
      </label>
      <input
        id={id}
        inputMode="numeric"
        className={inputClass(error, 'w-20 px-2 py-0.5 text-xs')}
        aria-invalid={error ? true : undefined}
        aria-describedby={error ? `${id}-error` : undefined}
        data-testid="revision-find"
        {...form.register('number')}
      />
      <Button size="sm" variant="secondary" type="submit">
        Show
      </Button>
      {error && (
        <span className="field-error mt-0 text-xs" role="alert" id={`${id}-error`}>
          {error}
        </span>
      )}
    </form>
  );
}
