import { z } from 'zod';

/** The team's own rules; today the sign-off one (lib/signoff-policy.ts). */
export const teamSettingsSchema = z.object({
  adminsMayReview: z.boolean({ error: 'adminsMayReview must be true or false' }),
});

export type TeamSettingsInput = z.infer<typeof teamSettingsSchema>;
