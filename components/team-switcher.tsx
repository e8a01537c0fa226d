'use client';

import { useRouter } from 'next/navigation';
import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { Jsonified } from '@/lib/json';
import type { TeamSwitchedBody } from '@/lib/response-bodies';
import { ApiError, sendJson } from '@/lib/queries/request';

export function TeamSwitcher({
  current,
  teams,
}: {
  current: number;
  teams: { teamId: number; teamName: string; role: string }[];
}) {
  const router = useRouter();
  const queryClient = useQueryClient();
  const switchTeam = useMutation({
    mutationFn: (teamId: number) => sendJson<Jsonified<TeamSwitchedBody>>('/api/session/team', 'POST', { teamId }),
    onSuccess: () => {
      queryClient.clear(); // every cached read belongs to the old team
      router.push('/designs');
      router.refresh();
    },
  });
  const pending = switchTeam.isPending;
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
        onChange={(e) => switchTeam.mutate(Number(e.target.value))}
      >
        {teams.map((t) => (
          <option key={t.teamId} value={t.teamId}>
            {t.teamName} ({t.role})
          </option>
        ))}
      </select>
      {switchTeam.isError && (
        <span role="alert" className="text-xs text-rose-300">
          {switchTeam.error instanceof ApiError ? switchTeam.error.firstMessage : 'Could not switch team'}
        </span>
      )}
    </label>
  );
}
