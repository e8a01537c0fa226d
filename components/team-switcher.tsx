'use client';

import { useRouter } from 'next/navigation';
import { useState } from 'react';

export function TeamSwitcher({
  current,
  teams,
}: {
  current: number;
  teams: { teamId: number; teamName: string; role: string }[];
}) {
  const router = useRouter();
  const [pending, setPending] = useState(false);
  if (teams.length === 1)
    return <span className="text-sm text-slate-300">{teams[0].teamName}</span>;
  return (
    <label className="flex items-center gap-2 text-sm text-slate-300">
      <span className="sr-only">Team</span>
      <select
        aria-label="Team"
        className="rounded-md border border-frame-light bg-frame-dark px-2 py-1 text-slate-100"
        value={current}
        disabled={pending}
        onChange={async (e) => {
          setPending(true);
          await fetch('/api/session/team', {
            method: 'POST',
            headers: { 'content-type': 'application/json' },
            body: JSON.stringify({ teamId: Number(e.target.value) }),
          });
          setPending(false);
          router.push('/designs');
          router.refresh();
        }}
      >
        {teams.map((t) => (
          <option key={t.teamId} value={t.teamId}>
            {t.teamName} ({t.role})
          </option>
        ))}
      </select>
    </label>
  );
}
