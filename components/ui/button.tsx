import type { ButtonHTMLAttributes } from 'react';

const VARIANTS = {
  primary: 'btn-primary',
  secondary: 'btn-secondary',
  danger: 'btn-danger',
  /** Approving a revision. */
  approve: 'btn bg-emerald-600 text-white hover:bg-emerald-500',
  /** Sending a revision back. */
  reject: 'btn bg-rose-600 text-white hover:bg-rose-500',
  /** A text link that acts (opens Scratch, shows more). */
  link: 'text-indigo-700 underline hover:text-indigo-600 disabled:opacity-50',
} as const;

export type ButtonVariant = keyof typeof VARIANTS;

/**
 * A button in one of our variants. `type` defaults to "button" (a form's submit says so);
 * `size="sm"` is the compact toolbar size.
 */
export function Button({
  variant = 'secondary',
  size,
  className = '',
  type = 'button',
  ...rest
}: ButtonHTMLAttributes<HTMLButtonElement> & { variant?: ButtonVariant; size?: 'sm'; [k: `data-${string}`]: string | undefined }) {
  return <button type={type} className={`${VARIANTS[variant]} ${size === 'sm' ? 'px-2 py-1 text-xs' : ''} ${className}`.trim()} {...rest} />;
}
