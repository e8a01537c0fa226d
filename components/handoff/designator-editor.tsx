'use client';

import { useRouter } from 'next/navigation';
import { useState } from 'react';
import { designUpdateSchema } from '@/lib/validation/design';

interface PartField {
  part: string;
  /** Our name of the part (R1 … C3, Rb). */
  label: string;
  /** The mapped designator, '' when none. */
  current: string;
  /** Used when nothing is mapped. */
  defaultDesignator: string;
}

export function DesignatorEditor({ designId, parts, canEdit }: { designId: number; parts: PartField[]; canEdit: boolean }) {
  const router = useRouter();
  const [values, setValues] = useState<Record<string, string>>(() => Object.fromEntries(parts.map((p) => [p.part, p.current])));
  const [errors, setErrors] = useState<Record<string, string>>({});
  const [status, setStatus] = useState<'idle' | 'saving' | 'saved' | 'failed'>('idle');
  const [message, setMessage] = useState('');

  const defaults = Object.fromEntries(parts.map((p) => [p.part, p.defaultDesignator]));
  const effective = (part: string) => (values[part]?.trim() || defaults[part]).toUpperCase();
  const dupes = new Set(parts.map((p) => effective(p.part)).filter((d, i, all) => all.indexOf(d) !== i));

  async function save(e: React.FormEvent) {
    e.preventDefault();
    const map = Object.fromEntries(Object.entries(values).filter(([, v]) => v.trim() !== '').map(([k, v]) => [k, v.trim()]));
    const parsed = designUpdateSchema.safeParse({ designatorMap: map });
    if (!parsed.success) {
      setErrors(Object.fromEntries(parsed.error.issues.map((i) => [String(i.path[1] ?? ''), i.message])));
      return;
    }
    if (dupes.size > 0) {
      setStatus('failed');
      setMessage(`Each part needs its own designator (${[...dupes].join(', ')} used twice).`);
      return;
    }
    setErrors({});
    setStatus('saving');
    const res = await fetch(`/api/designs/${designId}`, {
      method: 'PATCH',
      headers: { 'content-type': 'application/json' },
      body: JSON.stringify({ designatorMap: map }),
    }).catch(() => null);
    if (!res?.ok) {
      const body = res ? await res.json().catch(() => ({})) : {};
      setStatus('failed');
      setMessage(body.error ?? 'The mapping was not saved; try again');
      return;
    }
    setStatus('saved');
    setMessage('Saved. Exports use these designators.');
    router.refresh();
  }

  return (
    <form onSubmit={save} className="space-y-3" data-testid="designator-editor">
      <div className="grid grid-cols-2 gap-3 sm:grid-cols-4">
        {parts.map((p) => (
          <label key={p.part} className="block">
            <span className="label">{p.label}</span>
            <input
              className={`input font-mono ${errors[p.part] || dupes.has(effective(p.part)) ? 'input-error' : ''}`}
              name={p.part}
              value={values[p.part] ?? ''}
              placeholder={defaults[p.part]}
              disabled={!canEdit}
              maxLength={10}
              autoComplete="off"
              onChange={(e) => {
                setValues({ ...values, [p.part]: e.target.value });
                setStatus('idle');
              }}
            />
            {errors[p.part] && <span className="field-error">{errors[p.part]}</span>}
          </label>
        ))}
      </div>
      {canEdit ? (
        <div className="flex items-center gap-3">
          <button type="submit" className="btn-primary" disabled={status === 'saving'}>
            {status === 'saving' ? 'Saving…' : 'Save designators'}
          </button>
          {message && (
            <span className={`text-sm ${status === 'failed' ? 'text-rose-700' : 'text-emerald-700'}`} role="status">
              {message}
            </span>
          )}
        </div>
      ) : (
        <p className="text-sm text-slate-500">Only designers and admins change the mapping.</p>
      )}
    </form>
  );
}
