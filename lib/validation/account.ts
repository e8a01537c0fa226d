import { z } from 'zod';
import { roleSchema } from './team';

const password = z
  .string({ error: 'password must be text' })
  .min(8, 'a password has at least 8 characters')
  .max(200, 'a password has at most 200 characters');

export const passwordChangeSchema = z.object({
  currentPassword: z.string({ error: 'currentPassword must be text' }).min(1, 'enter your current password').max(200),
  newPassword: password,
});

export const apiTokenCreateSchema = z.object({
  name: z.string({ error: 'name must be text' }).trim().min(1, 'give the token a name').max(80, 'name must be at most 80 characters'),
});

export const invitationSchema = z.object({
  email: z.email({ error: 'enter a valid email address' }).trim().toLowerCase(),
  role: roleSchema,
});

export const acceptInvitationSchema = z.object({
  token: z.string({ error: 'token must be text' }).min(10, 'token is missing').max(200),
  name: z.string({ error: 'name must be text' }).trim().min(1, 'enter your name').max(120, 'name must be at most 120 characters').optional(),
  password: password.optional(),
});
