import { z } from 'zod';
import { ROLES } from '@/db/schema';

export const roleSchema = z.enum(ROLES, { error: 'role must be admin, designer, reviewer or viewer' });

export const setRoleSchema = z.object({
  userId: z.coerce.number().int().positive(),
  role: roleSchema,
});
