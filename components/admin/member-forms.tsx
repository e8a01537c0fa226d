'use client';

import { useActionState } from 'react';
import { addMemberAction, setRoleAction, type ActionState } from '@/app/(app)/admin/actions';

const ROLES = ['admin', 'designer', 'reviewer', 'viewer'] as const;

export function RoleSelect({ userId, role, self }: { userId: number; role: string; self: boolean }) {
  const [state, action, pending] = useActionState<ActionState, FormData>(setRoleAction, {});
  return (
    <form action={action} className="flex items-center gap-2">
      <input type="hidden" name="userId" value={userId} />
      <select
        name="role"
        defaultValue={role}
        aria-label="Role"
        className="input w-32 py-1"
        disabled={pending}
        onChange={(e) => e.currentTarget.form?.requestSubmit()}
      >
        {ROLES.map((r) => (
          <option key={r} value={r}>
            {r}
          </option>
        ))}
      </select>
      {self && <span className="text-xs text-slate-400">you</span>}
      {state.message && <span className={`text-xs ${state.ok ? 'text-emerald-700' : 'text-red-600'}`}>{state.message}</span>}
    </form>
  );
}

export function AddMemberForm() {
  const [state, action, pending] = useActionState<ActionState, FormData>(addMemberAction, {});
  const err = state.fieldErrors ?? {};
  return (
    <form action={action} className="card space-y-3 p-4" noValidate>
      <h2 className="font-semibold">Invite a member</h2>
      <p className="text-xs text-slate-500">
        We e-mail an invitation link; the person joins when they accept it (signing in, or choosing a name and password if they are new).
      </p>
      <div className="grid gap-3 sm:grid-cols-2">
        <Field label="Email" name="email" type="email" error={err.email} />
        <div>
          <label className="label" htmlFor="member-role">
            Role
          </label>
          <select id="member-role" name="role" className="input" defaultValue="designer">
            {ROLES.map((r) => (
              <option key={r} value={r}>
                {r}
              </option>
            ))}
          </select>
          {err.role && <p className="field-error">{err.role}</p>}
        </div>
      </div>
      <div className="flex items-center gap-3">
        <button type="submit" className="btn-primary" disabled={pending}>
          {pending ? 'Sending…' : 'Send invitation'}
        </button>
        {state.message && (
          <span role="status" className={`text-sm ${state.ok ? 'text-emerald-700' : 'text-red-600'}`}>
            {state.message}
          </span>
        )}
      </div>
    </form>
  );
}

function Field({ label, name, type = 'text', error }: { label: string; name: string; type?: string; error?: string }) {
  return (
    <div>
      <label className="label" htmlFor={`member-${name}`}>
        {label}
      </label>
      <input id={`member-${name}`} name={name} type={type} className={`input ${error ? 'input-error' : ''}`} aria-invalid={!!error} />
      {error && <p className="field-error">{error}</p>}
    </div>
  );
}
