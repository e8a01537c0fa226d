'use client';

import { useMutation, useQueryClient } from '@tanstack/react-query';
import Link from 'next/link';
import { useRouter } from 'next/navigation';
import { useState } from 'react';
import type { AnalyzeRequest } from '@/lib/engine/types';
import { ApiError } from '@/lib/queries/request';
import { Button } from '@/components/ui/button';
import { designKeys, saveRevision, type SavedRevision } from '@/lib/queries/revisions';

interface Props {
  designId: number;
  input: AnalyzeRequest;
  baseRevision: number | null;
  dirty: boolean;
  /** A reason saving is not possible right now (a field that does not parse, an impossible design). */
  blockedBy: string | null;
  onSaved: (saved: SavedRevision, input: AnalyzeRequest) => void;
  /** What the note starts with (e.g. "From r2: " when editing from an earlier revision). */
  initialNote?: string;
}

/** Note + save as a new revision; a conflict offers saving as the next revision anyway. */
export function SaveBar({ designId, input, baseRevision, dirty, blockedBy, onSaved, initialNote = '' }: Props) {
  const [note, setNote] = useState(initialNote);
  const [lastSaved, setLastSaved] = useState<number | null>(null);
  const queryClient = useQueryClient();
  const router = useRouter();

  const mutation = useMutation({
    mutationFn: (vars: { base: number | null; input: AnalyzeRequest; note: string }) =>
      saveRevision(designId, { baseRevision: vars.base, note: vars.note, input: vars.input }),
    onSuccess: (saved, vars) => {
      setLastSaved(saved.number);
      setNote('');
      onSaved(saved, vars.input);
      void queryClient.invalidateQueries({ queryKey: designKeys.revisions(designId) });
      void queryClient.invalidateQueries({ queryKey: designKeys.all, exact: true });
      router.refresh();
    },
  });

  const save = (base: number | null) => mutation.mutate({ base, input, note: note.trim() });
  const error = mutation.error instanceof ApiError ? mutation.error : null;
  const conflict = error?.status === 409 ? error.body : null;

  return (
    <div className="space-y-2">
      <form
        className="flex flex-wrap items-center gap-2"
        onSubmit={(e) => {
          e.preventDefault();
          save(baseRevision);
        }}
      >
        <span className="min-w-[9rem] text-sm" role="status" data-testid="save-state">
          {dirty ? (
            <span className="inline-flex items-center gap-1.5 font-medium text-amber-700">
              <span className="h-2 w-2 rounded-full bg-amber-500" aria-hidden /> Unsaved changes
            </span>
          ) : lastSaved !== null ? (
            <span className="text-emerald-700">Saved as r{lastSaved}</span>
          ) : (
            <span className="text-slate-500">{baseRevision === null ? 'Not saved yet' : `No changes since r${baseRevision}`}</span>
          )}
        </span>
        <label className="sr-only" htmlFor="revision-note">
          Note for the new revision
        </label>
        <input
          id="revision-note"
          className="input w-72 flex-1"
          placeholder="What changed, and why (saved with the revision)"
          maxLength={2000}
          value={note}
          onChange={(e) => setNote(e.target.value)}
          data-testid="revision-note"
        />
        <Button type="submit" variant="primary" disabled={!(dirty || baseRevision === null) || mutation.isPending || blockedBy !== null} title={blockedBy ?? undefined} data-testid="save-revision">
          {mutation.isPending ? 'Saving…' : baseRevision === null ? 'Save as r1' : `Save as r${baseRevision + 1}`}
        </Button>
      </form>
      {(dirty || baseRevision === null) && blockedBy && <p className="text-xs text-red-700">{blockedBy}</p>}
      {conflict && (
        <div className="rounded-md border border-amber-300 bg-amber-50 p-3 text-sm text-amber-900" role="alert" data-testid="save-conflict">
          <p>
            <strong>Someone saved r{conflict.latestRevision} after r{conflict.baseRevision ?? '—'}</strong>, the revision you started from. Your changes
            are still here, nothing was overwritten.
          </p>
          <div className="mt-2 flex flex-wrap items-center gap-3">
            <Button variant="primary" disabled={mutation.isPending} onClick={() => save(conflict.latestRevision ?? null)} data-testid="save-anyway">
              Save as r{(conflict.latestRevision ?? 0) + 1} anyway
            </Button>
            {conflict.baseRevision !== null && conflict.baseRevision !== undefined && (
              <Link
                className="text-indigo-700 underline"
                href={`/designs/${designId}/compare?a=${conflict.baseRevision}&b=${conflict.latestRevision}`}
                target="_blank"
                data-leave-ok
              >
                Compare r{conflict.baseRevision} with r{conflict.latestRevision} (new tab)
              </Link>
            )}
          </div>
        </div>
      )}
      {error && !conflict && (
        <div className="rounded-md border border-red-300 bg-red-50 p-3 text-sm text-red-800" role="alert" data-testid="save-error">
          <p>
            Not saved: {error.message}
            {error.status === 403 ? '' : ' Your changes are still here; try again.'}
          </p>
          {error.body.issues && (
            <ul className="mt-1 list-disc pl-5 text-xs">
              {error.body.issues.map((i) => (
                <li key={i.path}>
                  <code>{i.path}</code>: {i.message}
                </li>
              ))}
            </ul>
          )}
        </div>
      )}
    </div>
  );
}
