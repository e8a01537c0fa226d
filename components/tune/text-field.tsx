import type { InputHTMLAttributes } from 'react';

/** A labelled text input for a number (unit shown beside the label) with the problem under it. */
export function TextField({ id, label, unit, error, ...input }: { id: string; label: string; unit?: string; error?: string } & InputHTMLAttributes<HTMLInputElement>) {
  return (
    <div>
      <label className="label normal-case tracking-normal" htmlFor={id}>
        {label} {unit && <span className="text-slate-400">({unit})</span>}
      </label>
      <input
        id={id}
        inputMode="decimal"
        autoComplete="off"
        spellCheck={false}
        className={`input num font-mono ${error ? 'input-error' : ''}`}
        aria-invalid={error ? true : undefined}
        aria-describedby={error ? `${id}-error` : undefined}
        {...input}
      />
      {error && (
        <p id={`${id}-error`} className="field-error" role="alert">
          {error}
        </p>
      )}
    </div>
  );
}
