import { z } from 'zod';
import { formatSi, parseSi } from '@/lib/units/si';

/**
 * A text field holding a number with an optional SI prefix ('4.7u', '22k',
 * '1n5', '1.5e-9'), parsed to SI base units. Messages name the field and what
 * is wrong with it.
 */
export const siText = (label: string, unit: string, bound: 'positive' | 'nonNegative' = 'positive') =>
  z
    .string()
    .trim()
    .min(1, `${label} is required`)
    .transform((text, ctx) => {
      const v = parseSi(text);
      if (v === null) {
        ctx.addIssue({ code: 'custom', message: `${label}: "${text}" is not a number (try 4.7u, 22k, 1n5 or 1.5e-9)` });
        return z.NEVER;
      }
      if (bound === 'positive' && !(v > 0)) {
        ctx.addIssue({ code: 'custom', message: `${label} must be above 0 ${unit}`.trim() });
        return z.NEVER;
      }
      if (bound === 'nonNegative' && v < 0) {
        ctx.addIssue({ code: 'custom', message: `${label} cannot be negative` });
        return z.NEVER;
      }
      return v;
    });

/** A value as the SI text an engineer would type back ('4.7u', '22k'): prefix letters, 4 significant digits, no unit. */
export const toSiText = (value: number | undefined | null, digits = 4): string => {
  if (value === undefined || value === null || !Number.isFinite(value)) return '';
  return formatSi(value, '', digits).replace(' ', '').replace('µ', 'u');
};

/** Parse one SI text field outside a form; returns a message when it is not a usable number. */
export const parseSiField = (text: string, label: string, unit: string): { value: number } | { error: string } => {
  const r = siText(label, unit).safeParse(text);
  return r.success ? { value: r.data } : { error: r.error.issues[0]?.message ?? `${label} is not valid` };
};
