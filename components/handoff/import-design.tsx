'use client';

import Link from 'next/link';
import { useState } from 'react';

interface Imported {
  id: number;
  name: string;
  revision: number;
  resultsMatch: boolean;
}

export function ImportDesign() {
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<{ message: string; issues: { path: string; message: string }[] } | null>(null);
  const [done, setDone] = useState<Imported | null>(null);

  async function onFile(file: File) {
    setBusy(true);
    setError(null);
    setDone(null);
    const res = await fetch('/api/designs/import', { method: 'POST', headers: { 'content-type': 'application/json' }, body: await file.text() }).catch(
      () => null,
    );
    const body = res ? await res.json().catch(() => ({})) : { error: 'The server could not be reached' };
    setBusy(false);
    if (!res?.ok) setError({ message: body.error ?? 'The design file was not imported', issues: body.issues ?? [] });
    else setDone(body as Imported);
  }

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
          disabled={busy}
          onChange={(e) => {
            const f = e.target.files?.[0];
            if (f) void onFile(f);
            e.target.value = '';
          }}
        />
        {busy ? 'Importing…' : 'Choose design file…'}
      </label>
      {error && (
        <div className="mt-3 rounded border border-rose-300 bg-rose-50 p-3 text-sm text-rose-800" role="alert">
          <p className="font-medium">{error.message}</p>
          {error.issues.length > 0 && (
            <ul className="mt-1 list-disc pl-5">
              {error.issues.slice(0, 8).map((i) => (
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
