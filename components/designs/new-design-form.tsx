'use client';

import { zodResolver } from '@hookform/resolvers/zod';
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { useRouter } from 'next/navigation';
import { useForm } from 'react-hook-form';
import type { z } from 'zod';
import type { Design } from '@/db/schema';
import { TOPOLOGY_LABELS } from '@/lib/catalog/topologies';
import { TOPOLOGIES } from '@/lib/engine/types';
import type { Jsonified } from '@/lib/json';
import { sendJson, showServerErrors } from '@/lib/queries/request';
import { designKeys } from '@/lib/queries/revisions';
import { designCreateSchema } from '@/lib/validation/design';

type FormValues = z.input<typeof designCreateSchema>;
const FIELDS = ['name', 'topology', 'description'] as const;

export default function NewDesignForm({ onCancel }: { onCancel: () => void }) {
  const router = useRouter();
  const {
    register,
    handleSubmit,
    setError,
    formState: { errors, isSubmitting },
  } = useForm<FormValues>({ resolver: zodResolver(designCreateSchema), defaultValues: { topology: 'buck' } });

  const queryClient = useQueryClient();
  const create = useMutation({
    mutationFn: (values: FormValues) => sendJson<Jsonified<Design>>('/api/designs', 'POST', values),
    onSuccess: (design) => {
      void queryClient.invalidateQueries({ queryKey: designKeys.all });
      router.push(`/designs/${design.id}`);
    },
    onError: (err) => showServerErrors(err, FIELDS, setError, 'Could not create the design'),
  });
  const onSubmit = handleSubmit((values) => create.mutateAsync(values).catch(() => undefined));

  return (
    <form onSubmit={onSubmit} className="card flex flex-wrap items-start gap-3 p-3" noValidate>
      <div>
        <label className="label" htmlFor="new-name">
          Name
        </label>
        <input id="new-name" className={`input w-64 ${errors.name ? 'input-error' : ''}`} {...register('name')} autoFocus />
        {errors.name && <p className="field-error">{errors.name.message}</p>}
      </div>
      <div>
        <label className="label" htmlFor="new-topology">
          Topology
        </label>
        <select id="new-topology" className="input w-36" {...register('topology')}>
          {TOPOLOGIES.map((t) => (
            <option key={t} value={t}>
              {TOPOLOGY_LABELS[t]}
            </option>
          ))}
        </select>
      </div>
      <div>
        <label className="label" htmlFor="new-description">
          Description
        </label>
        <input id="new-description" className="input w-72" {...register('description')} />
      </div>
      <div className="flex gap-2 self-end">
        <button type="submit" className="btn-primary" disabled={isSubmitting}>
          Create
        </button>
        <button type="button" className="btn-secondary" onClick={onCancel}>
          Cancel
        </button>
      </div>
      {errors.root && <p className="field-error w-full">{errors.root.message}</p>}
    </form>
  );
}
