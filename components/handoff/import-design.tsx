'use client';

import { useMutation } from '@tanstack/react-query';
import Link from 'next/link';
import { importDesignRequest } from '@/lib/queries/designs';
import { ApiError } from '@/lib/queries/request';

/** A design file exported from Phasewright becomes a new design; a bad file lists what is wrong, by path. */
export function ImportDesign() {
  const upload = useMutation({ mutationFn: async (file: File) => importDesignRequest(await file.text()) });
  const error = upload.error;
  const issues = error instanceof ApiError ? (error.body.issues ?? []) : [];
  const done = upload.data;

  return (
    <section className="card p-4" aria-labelledby="import-heading" data-testid="import-design">
      <h2 id="import-heading" className="text-lg font-semibold">
        Import a design file
      </h2>
      <p className="mb-3 text-sm text-slate-600">
        A <code>.json</code> design file exported from Phasewright becomes a new design in this team, its first revision identical to the one
        exported.
      </p>
      <label className="btn-secondary cursor-pointer">
        <input
          type="file"
          accept=".json,application/json"
          className="sr-only"
          disabled={upload.isPending}
          onChange={(e) => {
            const f = e.target.files?.[0];
            if (f) upload.mutate(f);
            e.target.value = '';
          }}
        />
        {upload.isPending ? 'Importing…' : 'Choose design file…'}
      </label>
      {error && (
        <div className="mt-3 rounded border border-rose-300 bg-rose-50 p-3 text-sm text-rose-800" role="alert">
          <p className="font-medium">{error.message || 'The design file was not imported'}</p>
          {issues.length > 0 && (
            <ul className="mt-1 list-disc pl-5">
              {issues.slice(0, 8).map((i) => (
                <li key={i.path + i.message}>
                  <code>{i.path}</code>: {i.message}
                </li>
              ))}
            </ul>
          )}
        </div>
      )}
      {done && (
        <p className="mt-3 text-sm text-emerald-800" role="status">
          Imported as{' '}
          <Link href={`/designs/${done.id}`} className="font-medium underline">
            {done.name}
          </Link>{' '}
          (r{done.revision}).{' '}
          {done.resultsMatch ? 'Crossover and margins match the file.' : 'Note: crossover or margins differ from those stored in the file.'}
        </p>
      )}
    </section>
  );
}
