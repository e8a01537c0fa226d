/**
 * The sign-in fields' rules, in one place for both checkers: the server's zod schema
 * (lib/validation/sign-in.ts, which next-auth's credentials provider runs) and the sign-in form's
 * react-hook-form rules. The form does not ship zod: any zod build adds about 34 kB (gzip) to a
 * page budgeted at 160 kB, more than the rest of the form. tests/lib/validation/sign-in.test.ts
 * checks that both checkers give the same answer and message on the same inputs.
 */
export const SIGN_IN_RULES = {
  email: {
    message: 'enter a valid email address',
    // The shape the browser's own type="email" accepts, less quoted local parts; zod's email
    // check on the server has the last word.
    pattern: /^[A-Za-z0-9.!#$%&'*+/=?^_`{|}~-]+@[A-Za-z0-9](?:[A-Za-z0-9-]{0,61}[A-Za-z0-9])?(?:\.[A-Za-z0-9](?:[A-Za-z0-9-]{0,61}[A-Za-z0-9])?)*\.[A-Za-z]{2,}$/,
  },
  password: {
    requiredMessage: 'enter your password',
    max: 200,
    maxMessage: 'a password has at most 200 characters',
    typeMessage: 'password must be text',
  },
} as const;

export interface SignInFields {
  email: string;
  password: string;
}

/** react-hook-form's register() rules for each field: the same answer as the server's schema. */
export const signInFormRules = {
  email: {
    setValueAs: (v: unknown) => (typeof v === 'string' ? v.trim() : v),
    validate: (v: unknown) => (typeof v === 'string' && SIGN_IN_RULES.email.pattern.test(v.trim())) || SIGN_IN_RULES.email.message,
  },
  password: {
    required: SIGN_IN_RULES.password.requiredMessage,
    maxLength: { value: SIGN_IN_RULES.password.max, message: SIGN_IN_RULES.password.maxMessage },
  },
} as const;
