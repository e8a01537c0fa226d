import type { z } from 'zod';
import type { getTeamSignoffSettings } from '@/db/queries';
import type { Jsonified } from '@/lib/json';
import type { InvitationSentBody } from '@/lib/response-bodies';
import type { invitationSchema } from '@/lib/validation/account';
import type { teamSettingsSchema } from '@/lib/validation/team-settings';
import { sendJson } from './request';

/** Team admin writes (mutationFns). */
export const inviteMemberRequest = (body: z.input<typeof invitationSchema>) => sendJson<Jsonified<InvitationSentBody>>('/api/team/invitations', 'POST', body);

export const saveTeamSettingsRequest = (body: z.input<typeof teamSettingsSchema>) =>
  sendJson<Jsonified<ReturnType<typeof getTeamSignoffSettings>>>('/api/team/settings', 'PUT', body);
