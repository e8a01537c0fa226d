import { describe, expect, it } from 'vitest';
import { signInSchema } from '@/lib/validation/sign-in';
import { signInFormRules, type SignInFields } from '@/lib/validation/sign-in-rules';

/** What react-hook-form reports for a field under these rules: the first failing rule's message. */
function formMessage(field: keyof SignInFields, raw: string): string | null {
  const rules: { setValueAs?: (v: unknown) => unknown; required?: string; maxLength?: { value: number; message: string }; validate?: (v: unknown) => true | string } = signInFormRules[field];
  const v = rules.setValueAs ? rules.setValueAs(raw) : raw;
  if (rules.required && v === '') return rules.required;
  if (rules.maxLength && typeof v === 'string' && v.length > rules.maxLength.value) return rules.maxLength.message;
  if (rules.validate) {
    const r = rules.validate(v);
    if (r !== true) return r;
  }
  return null;
}

function serverMessage(field: keyof SignInFields, value: SignInFields): string | null {
  const r = signInSchema.safeParse(value);
  if (r.success) return null;
  return r.error.issues.find((i) => i.path[0] === field)?.message ?? null;
}

const emails = ['designer@demo.test', '  padded@example.com ', 'a.b+c@sub.example.org', '', 'plain', 'no-at.example.com', 'two@@example.com', 'x@y', 'space in@example.com', 'trailing@example.com.'];
const passwords = ['', 'p', 'phasewright-demo', 'x'.repeat(200), 'x'.repeat(201)];

describe('sign-in rules: the form (no zod in the browser) and the server schema agree', () => {
  it.each(emails)('email %j', (email) => {
    const value = { email, password: 'pw' };
    expect(formMessage('email', email)).toBe(serverMessage('email', value));
  });
  it.each(passwords)('password of %#', (password) => {
    const value = { email: 'a@example.com', password };
    expect(formMessage('password', password)).toBe(serverMessage('password', value));
  });
  it('the server trims the email the form trims', () => {
    const r = signInSchema.safeParse({ email: '  padded@example.com ', password: 'pw' });
    expect(r.success && r.data.email).toBe('padded@example.com');
  });
});
