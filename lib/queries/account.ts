import { queryOptions } from '@tanstack/react-query';
import type { z } from 'zod';
import type { createApiToken, listApiTokens } from '@/db/queries';
import type { Jsonified } from '@/lib/json';
import type { acceptInvitationSchema, apiTokenCreateSchema, passwordChangeSchema } from '@/lib/validation/account';
import { requestJson, sendJson } from './request';

/** A personal API token as GET /api/account/tokens lists it. */
export type ApiTokenRow = Jsonified<ReturnType<typeof listApiTokens>[number]>;

export const apiTokensQueryOptions = () =>
  queryOptions({
    queryKey: ['account', 'api-tokens'] as const,
    queryFn: () => requestJson<{ tokens: ApiTokenRow[] }>('/api/account/tokens').then((b) => b.tokens),
  });

/** The new token (its secret shown once). */
export const createApiTokenRequest = (body: z.input<typeof apiTokenCreateSchema>) =>
  sendJson<Jsonified<ReturnType<typeof createApiToken>>>('/api/account/tokens', 'POST', body);

export const revokeApiTokenRequest = (id: number) => sendJson<unknown>(`/api/account/tokens/${id}`, 'DELETE');

/** Every session ends: the caller signs in again. */
export const changePasswordRequest = (body: z.input<typeof passwordChangeSchema>) => sendJson<unknown>('/api/account/password', 'POST', body);

export const acceptInvitationRequest = (body: z.input<typeof acceptInvitationSchema>) => sendJson<unknown>('/api/invitations/accept', 'POST', body);
