'use client';

import { useId, useState } from 'react';

export interface ValueCellProps {
  label: string;
  /** The value as shown when not being edited. */
  display: string;
  /** The value as editable text (e.g. '1.2k'). */
  editText: string;
  disabled: boolean;
  /** Apply typed text; returns a message naming the problem, or null when applied. */
  onCommit: (text: string) => string | null;
  /** ArrowUp / ArrowDown (Shift: larger step). */
  onStep?: (sign: 1 | -1, big: boolean) => void;
  testId?: string;
  width?: string;
}

/**
 * A number typed as text (SI prefixes allowed): Enter or leaving the field
 * applies it, Escape restores the current value, arrow keys step it. A
 * rejected entry stays in the field with the reason under it.
 */
export function ValueCell({ label, display, editText, disabled, onCommit, onStep, testId, width = 'w-28' }: ValueCellProps) {
  const [text, setText] = useState<string | null>(null);
  const [error, setError] = useState<string | null>(null);
  const id = useId();

  const commit = () => {
    if (text === null) return;
    if (text.trim() === editText) {
      setText(null);
      setError(null);
      return;
    }
    const problem = onCommit(text);
    setError(problem);
    if (!problem) setText(null);
  };

  return (
    <div>
      <input
        id={id}
        aria-label={label}
        className={`input num ${width} py-1 text-right font-mono ${error ? 'input-error' : ''}`}
        value={text ?? display}
        disabled={disabled}
        inputMode="decimal"
        autoComplete="off"
        spellCheck={false}
        data-testid={testId}
        aria-invalid={error ? true : undefined}
        aria-describedby={error ? `${id}-err` : undefined}
        onFocus={() => setText(editText)}
        onChange={(e) => setText(e.target.value)}
        onBlur={commit}
        onKeyDown={(e) => {
          if (e.key === 'Enter') {
            e.preventDefault();
            commit();
          } else if (e.key === 'Escape') {
            setText(editText);
            setError(null);
          } else if ((e.key === 'ArrowUp' || e.key === 'ArrowDown') && onStep) {
            e.preventDefault();
            onStep(e.key === 'ArrowUp' ? 1 : -1, e.shiftKey);
            setText(null);
            setError(null);
          }
        }}
      />
      {error && (
        <p id={`${id}-err`} className="field-error max-w-xs text-left" role="alert">
          {error}
        </p>
      )}
    </div>
  );
}
