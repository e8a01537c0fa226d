import { z } from 'zod';
import { SIGN_IN_RULES } from './sign-in-rules';

const { email, password } = SIGN_IN_RULES;

/** The sign-in fields as next-auth's credentials provider checks them (lib/auth.ts). */
export const signInSchema = z.object({
  email: z.string({ error: email.message }).trim().pipe(z.email({ error: email.message })),
  password: z.string({ error: password.typeMessage }).min(1, password.requiredMessage).max(password.max, password.maxMessage),
});
