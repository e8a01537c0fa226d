'use client';

import { useMutation } from '@tanstack/react-query';
import { useRouter } from 'next/navigation';
import { formatDay } from '@/lib/format';
import { Button } from '@/components/ui/button';
import { archiveDesignRequest, deleteDesignRequest } from '@/lib/queries/designs';

interface Props {
  designId: number;
  name: string;
  archivedAt: string | null;
  canEdit: boolean;
  /** Only a design nobody reviewed may be deleted for good. */
  deletable: boolean;
}

/** Archive / restore (and delete while unreviewed) in the design header; an archived design says so on every tab. */
export function ArchiveControl({ designId, name, archivedAt, canEdit, deletable }: Props) {
  const router = useRouter();
  const archive = useMutation({
    mutationFn: (on: boolean) => archiveDesignRequest(designId, on),
    onSuccess: (_d, on) => (on ? router.push('/designs') : router.refresh()),
  });
  const remove = useMutation({
    mutationFn: () => deleteDesignRequest(designId),
    onSuccess: () => router.push('/designs'),
  });
  const error = archive.error ?? remove.error;

  return (
    <div className="flex w-full flex-wrap items-center gap-2 text-sm" data-testid="archive-control">
      {archivedAt && (
        <p className="rounded-md bg-slate-200 px-3 py-1 text-slate-700" role="status" data-testid="archived-banner">
          Archived {formatDay(archivedAt)}: read-only, hidden from the list. Its revisions are kept as they were.
        </p>
      )}
      {canEdit &&
        (archivedAt ? (
          <Button disabled={archive.isPending} onClick={() => archive.mutate(false)}>
            Restore to the list
          </Button>
        ) : (
          <button
            type="button"
            className="text-slate-500 hover:text-slate-800 hover:underline"
            disabled={archive.isPending}
            onClick={() => {
              if (confirm(`Archive “${name}”? It leaves the designs list and becomes read-only; you can restore it from Archived.`)) archive.mutate(true);
            }}
          >
            Archive design
          </button>
        ))}
      {canEdit && deletable && (
        <button
          type="button"
          className="text-rose-600 hover:underline"
          disabled={remove.isPending}
          onClick={() => {
            if (confirm(`Delete “${name}” for good? Nobody has reviewed it, so nothing of record is lost. This cannot be undone.`)) remove.mutate();
          }}
        >
          Delete
        </button>
      )}
      {error && (
        <span role="alert" className="text-rose-700">
          {error.message}
        </span>
      )}
    </div>
  );
}
