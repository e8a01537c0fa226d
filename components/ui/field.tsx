import type { ReactNode } from 'react';

/** The input's classes, red when the field has an error. */
export const inputClass = (error?: string | null, extra = '') => `input ${error ? 'input-error' : ''} ${extra}`.trim();

/**
 * One form field: its label, the input (the slot, so any input, select or textarea fits), a hint
 * and the error text beside it — the client's zod message or the server's issue for that path.
 */
export function Field({
  label,
  htmlFor,
  error,
  hint,
  children,
  className,
}: {
  label: ReactNode;
  /** The input's id. */
  htmlFor: string;
  error?: string | null;
  hint?: ReactNode;
  children: ReactNode;
  className?: string;
}) {
  return (
    <div className={className}>
      <label className="label" htmlFor={htmlFor}>
        {label}
      </label>
      {children}
      {hint && <p className="mt-1 text-xs text-slate-500">{hint}</p>}
      {error && (
        <p className="field-error" role="alert" id={`${htmlFor}-error`} data-testid={`${htmlFor}-error`}>
          {error}
        </p>
      )}
    </div>
  );
}

/** A form's error that names no field (or a failed request), under the form. */
export function FormError({ message, testId }: { message?: string | null; testId?: string }) {
  if (!message) return null;
  return (
    <p role="alert" className="rounded-md bg-red-50 px-3 py-2 text-sm text-red-700" data-testid={testId}>
      {message}
    </p>
  );
}
