'use server';

import { revalidatePath } from 'next/cache';
import type { z } from 'zod';
import { getDb } from '@/db/client';
import { MembershipError, setMemberRole } from '@/db/queries';
import type { FieldIssue } from '@/lib/engine/types';
import { can, getCurrentUser } from '@/lib/auth';
import { setRoleSchema } from '@/lib/validation/team';

/** A server action's answer, in the API's error shape when it failed (the form puts issues beside fields). */
export type ActionAnswer = { ok: true; message: string } | { ok: false; error: string; issues?: FieldIssue[] };

/**
 * Change a member's role (admins). Called by the Team page's role select through react-hook-form;
 * checked here again with the same schema, whatever the client sent.
 */
export async function setRoleAction(values: z.input<typeof setRoleSchema>): Promise<ActionAnswer> {
  const user = await getCurrentUser();
  if (!user) return { ok: false, error: 'Sign in first' };
  if (!can.manageTeam(user.role)) return { ok: false, error: `Your role (${user.role}) may not manage the team` };
  const parsed = setRoleSchema.safeParse(values);
  if (!parsed.success) return { ok: false, error: 'Check the role', issues: parsed.error.issues.map((i) => ({ path: i.path.join('.'), message: i.message })) };
  try {
    setMemberRole(getDb(), user.id, user.teamId, parsed.data.userId, parsed.data.role);
    revalidatePath('/admin');
    return { ok: true, message: 'Role changed' };
  } catch (err) {
    if (err instanceof MembershipError) return { ok: false, error: err.message, issues: [{ path: 'role', message: err.message }] };
    console.error(err);
    return { ok: false, error: 'Could not change the role; nothing was changed' };
  }
}
