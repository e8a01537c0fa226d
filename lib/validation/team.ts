import { z } from 'zod';
import { ROLES } from '@/lib/catalog/roles';

export const roleSchema = z.enum(ROLES, { error: 'role must be admin, designer, reviewer or viewer' });

export const addMemberSchema = z.object({
  email: z.email({ error: 'enter a valid email address' }).trim().toLowerCase(),
  name: z.string().trim().max(120, 'name must be at most 120 characters').optional(),
  role: roleSchema,
  password: z.string().max(200).optional(),
});

export const setRoleSchema = z.object({
  userId: z.coerce.number().int().positive(),
  role: roleSchema,
});
