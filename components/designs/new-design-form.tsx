'use client';

import { zodResolver } from '@hookform/resolvers/zod';
import { useRouter } from 'next/navigation';
import { useForm } from 'react-hook-form';
import type { z } from 'zod';
import { designCreateSchema } from '@/lib/validation/design';

type FormValues = z.input<typeof designCreateSchema>;

export default function NewDesignForm({ onCancel }: { onCancel: () => void }) {
  const router = useRouter();
  const {
    register,
    handleSubmit,
    setError,
    formState: { errors, isSubmitting },
  } = useForm<FormValues>({ resolver: zodResolver(designCreateSchema), defaultValues: { topology: 'buck' } });

  const onSubmit = handleSubmit(async (values) => {
    const res = await fetch('/api/designs', {
      method: 'POST',
      headers: { 'content-type': 'application/json' },
      body: JSON.stringify(values),
    });
    const body = await res.json().catch(() => ({}));
    if (!res.ok) {
      const issue = body.issues?.[0];
      setError((issue?.path as keyof FormValues) ?? 'root', { message: issue?.message ?? body.error ?? 'Could not create the design' });
      return;
    }
    router.push(`/designs/${body.id}`);
  });

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
          <option value="buck">Buck</option>
          <option value="boost">Boost</option>
          <option value="buck-boost">Buck-boost</option>
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
