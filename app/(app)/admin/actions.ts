'use server';

import { revalidatePath } from 'next/cache';
import { getDb } from '@/db/client';
import { addTeamMember, MembershipError, setMemberRole } from '@/db/queries';
import { can, getCurrentUser } from '@/lib/auth';
import { notifyAddedToTeam } from '@/lib/notify';
import { addMemberSchema, setRoleSchema } from '@/lib/validation/team';

export interface ActionState {
  ok?: boolean;
  message?: string;
  fieldErrors?: Record<string, string>;
}

async function requireAdmin() {
  const user = await getCurrentUser();
  if (!user) return { error: 'Sign in first' } as const;
  if (!can.manageTeam(user.role)) return { error: `Your role (${user.role}) may not manage the team` } as const;
  return { user } as const;
}

function blankToUndefined(v: FormDataEntryValue | null) {
  const s = typeof v === 'string' ? v.trim() : '';
  return s === '' ? undefined : s;
}

export async function addMemberAction(_prev: ActionState, form: FormData): Promise<ActionState> {
  const auth = await requireAdmin();
  if ('error' in auth) return { message: auth.error };
  const parsed = addMemberSchema.safeParse({
    email: form.get('email'),
    name: blankToUndefined(form.get('name')),
    role: form.get('role'),
    password: blankToUndefined(form.get('password')),
  });
  if (!parsed.success) {
    const fieldErrors: Record<string, string> = {};
    for (const i of parsed.error.issues) fieldErrors[String(i.path[0])] ??= i.message;
    return { fieldErrors, message: 'Check the highlighted fields' };
  }
  try {
    const { user, created } = addTeamMember(getDb(), auth.user.id, auth.user.teamId, parsed.data);
    await notifyAddedToTeam({ to: user.email, name: user.name, teamId: auth.user.teamId, teamName: auth.user.teamName, role: parsed.data.role, by: auth.user.name });
    revalidatePath('/admin');
    return { ok: true, message: `${user.email} added as ${parsed.data.role}${created ? ' (new account)' : ''}` };
  } catch (err) {
    if (err instanceof MembershipError) return { fieldErrors: { [err.field]: err.message }, message: err.message };
    console.error(err);
    return { message: 'Could not add the member; nothing was changed' };
  }
}

export async function setRoleAction(_prev: ActionState, form: FormData): Promise<ActionState> {
  const auth = await requireAdmin();
  if ('error' in auth) return { message: auth.error };
  const parsed = setRoleSchema.safeParse({ userId: form.get('userId'), role: form.get('role') });
  if (!parsed.success) return { message: parsed.error.issues[0]?.message ?? 'Invalid role change' };
  try {
    setMemberRole(getDb(), auth.user.id, auth.user.teamId, parsed.data.userId, parsed.data.role);
    revalidatePath('/admin');
    return { ok: true, message: 'Role changed' };
  } catch (err) {
    if (err instanceof MembershipError) return { message: err.message };
    console.error(err);
    return { message: 'Could not change the role; nothing was changed' };
  }
}
