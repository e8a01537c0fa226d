'use client';

import { zodResolver } from '@hookform/resolvers/zod';
import { useMutation } from '@tanstack/react-query';
import { useRouter } from 'next/navigation';
import { useForm } from 'react-hook-form';
import { z } from 'zod';
import { duplicateDesignators } from '@/lib/handoff/parts-list';
import { updateDesignRequest } from '@/lib/queries/designs';
import { showServerErrors } from '@/lib/queries/request';
import { designUpdateSchema } from '@/lib/validation/design';
import { Button } from '@/components/ui/button';
import { Field, FormError, inputClass } from '@/components/ui/field';

interface PartField {
  part: string;
  /** Our name of the part (R1 … C3, Rb). */
  label: string;
  /** The mapped designator, '' when none. */
  current: string;
  /** Used when nothing is mapped. */
  defaultDesignator: string;
}

/** The form holds text per part ('' = the default designator); what is sent is the shared schema's mapping. */
const formSchema = z.object({
  designatorMap: z
    .record(z.string(), z.string())
    .transform((m) => Object.fromEntries(Object.entries(m).filter(([, v]) => v.trim() !== '')))
    .pipe(designUpdateSchema.shape.designatorMap.unwrap()),
});
type Fields = z.input<typeof formSchema>;

export function DesignatorEditor({ designId, parts, canEdit }: { designId: number; parts: PartField[]; canEdit: boolean }) {
  const router = useRouter();
  const start = { designatorMap: Object.fromEntries(parts.map((p) => [p.part, p.current])) };
  const form = useForm<Fields, unknown, z.output<typeof formSchema>>({ resolver: zodResolver(formSchema), defaultValues: start });
  const save = useMutation({
    mutationFn: (v: z.output<typeof formSchema>) => updateDesignRequest(designId, v),
    onMutate: () => form.clearErrors(),
    onSuccess: (_d, v) => {
      form.reset({ designatorMap: { ...start.designatorMap, ...v.designatorMap } }, { keepValues: true });
      router.refresh();
    },
    onError: (err) => showServerErrors(err, parts.map((p) => `designatorMap.${p.part}` as const), form.setError, 'The mapping was not saved; try again'),
  });

  const values = form.watch('designatorMap');
  const effective = (p: PartField) => (values[p.part]?.trim() || p.defaultDesignator).toUpperCase();
  // The parts list's own rule: each part needs its own designator.
  const dupes = new Set(duplicateDesignators(parts.map((p) => ({ designator: effective(p) }))));
  const errors = form.formState.errors.designatorMap as Record<string, { message?: string } | undefined> | undefined;

  const onSubmit = form.handleSubmit((v) => {
    if (dupes.size > 0) return form.setError('root', { message: `Each part needs its own designator (${[...dupes].join(', ')} used twice).` });
    save.mutate(v);
  });

  return (
    <form onSubmit={onSubmit} className="space-y-3" data-testid="designator-editor" noValidate>
      <div className="grid grid-cols-2 gap-3 sm:grid-cols-4">
        {parts.map((p) => {
          const error = errors?.[p.part]?.message;
          return (
            <Field key={p.part} label={p.label} htmlFor={`designator-${p.part}`} error={error}>
              <input
                id={`designator-${p.part}`}
                className={inputClass(error || (dupes.has(effective(p)) ? 'duplicate' : null), 'font-mono')}
                placeholder={p.defaultDesignator}
                disabled={!canEdit}
                maxLength={10}
                autoComplete="off"
                aria-invalid={!!error || dupes.has(effective(p))}
                {...form.register(`designatorMap.${p.part}`)}
              />
            </Field>
          );
        })}
      </div>
      {canEdit ? (
        <div className="flex items-center gap-3">
          <Button type="submit" variant="primary" disabled={save.isPending}>
            {save.isPending ? 'Saving…' : 'Save designators'}
          </Button>
          {save.isSuccess && !form.formState.isDirty && (
            <span className="text-sm text-emerald-700" role="status">
              Saved. Exports use these designators.
            </span>
          )}
        </div>
      ) : (
        <p className="text-sm text-slate-500">Only designers and admins change the mapping.</p>
      )}
      <FormError message={form.formState.errors.root?.message} />
    </form>
  );
}
