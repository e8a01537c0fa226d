import type { Metadata } from 'next';
import { redirect } from 'next/navigation';
import { getDb } from '@/db/client';
import { getTeamSignoffSettings, listAudit, listTeamMembers } from '@/db/queries';
import { can, requireUser } from '@/lib/auth';
import { describeAudit } from '@/lib/audit-text';
import { formatIsoMinute } from '@/lib/format';
import { AddMemberForm, RoleSelect } from '@/components/admin/member-forms';
import { SignoffSettings } from '@/components/admin/signoff-settings';

export const metadata: Metadata = { title: 'Team' };

export default async function AdminPage() {
  const user = await requireUser();
  if (!can.manageTeam(user.role)) redirect('/designs');
  const db = getDb();
  const members = listTeamMembers(db, user.teamId);
  const audit = listAudit(db, user.teamId, 30);
  return (
    <div className="grid gap-6 lg:grid-cols-[2fr_1fr]">
      <section className="space-y-4">
        <h1 className="text-2xl font-semibold">Team · {user.teamName}</h1>
        <div className="card overflow-hidden">
          <table className="table-base" data-testid="members-table">
            <thead>
              <tr>
                <th>Name</th>
                <th>Email</th>
                <th>Role</th>
              </tr>
            </thead>
            <tbody>
              {members.map((m) => (
                <tr key={m.userId}>
                  <td className="font-medium">{m.name}</td>
                  <td className="text-slate-600">{m.email}</td>
                  <td>
                    <RoleSelect userId={m.userId} role={m.role} self={m.userId === user.id} />
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
        <AddMemberForm />
        <SignoffSettings adminsMayReview={getTeamSignoffSettings(db, user.teamId).adminsMayReview} />
      </section>
      <section>
        <h2 className="mb-2 text-lg font-semibold">Recent activity</h2>
        <ol className="card divide-y divide-slate-100 text-sm">
          {audit.map((a) => (
            <li key={a.id} className="px-3 py-2">
              <div className="font-mono text-xs text-slate-500">{formatIsoMinute(a.createdAt)}</div>
              <div>
                <span className="font-medium">{a.userName ?? 'System'}</span> {describeAudit(a)}
              </div>
            </li>
          ))}
          {audit.length === 0 && <li className="px-3 py-6 text-center text-slate-500">No activity yet.</li>}
        </ol>
      </section>
    </div>
  );
}
