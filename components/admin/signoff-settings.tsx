'use client';

import { useMutation } from '@tanstack/react-query';
import { useState } from 'react';

/** The team's sign-off setting: may admins review (lib/signoff-policy.ts)? Saved at once. */
export function SignoffSettings({ adminsMayReview }: { adminsMayReview: boolean }) {
  const [value, setValue] = useState(adminsMayReview);
  const save = useMutation({
    mutationFn: async (next: boolean) => {
      const res = await fetch('/api/team/settings', {
        method: 'PUT',
        headers: { 'content-type': 'application/json' },
        body: JSON.stringify({ adminsMayReview: next }),
      });
      const body = (await res.json().catch(() => ({}))) as { error?: string; adminsMayReview?: boolean };
      if (!res.ok) throw new Error(body.error ?? `Saving failed (${res.status})`);
      return body.adminsMayReview ?? next;
    },
    onSuccess: (saved) => setValue(saved),
  });
  return (
    <div className="card space-y-2 p-4" data-testid="signoff-settings">
      <h2 className="font-semibold">Sign-off</h2>
      <label className="flex items-start gap-2 text-sm">
        <input
          type="checkbox"
          className="mt-1"
          checked={value}
          disabled={save.isPending}
          onChange={(e) => {
            setValue(e.target.checked);
            save.mutate(e.target.checked);
          }}
        />
        <span>
          Admins may review and sign off revisions, as reviewers do.
          <span className="block text-slate-500">
            Either way, nobody decides on a revision they wrote or submitted, and a revision sent to a named reviewer waits for that reviewer.
          </span>
        </span>
      </label>
      {save.isError && (
        <p role="alert" className="text-sm text-red-700">
          {save.error.message}; the setting was not changed.
        </p>
      )}
    </div>
  );
}
