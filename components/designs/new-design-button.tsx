'use client';

import dynamic from 'next/dynamic';
import { useState } from 'react';

// The form (react-hook-form, zod) loads when asked for, keeping the designs list's first load light.
const loadForm = () => import('./new-design-form');
const NewDesignForm = dynamic(loadForm, { ssr: false, loading: () => <span className="text-sm text-slate-500">Opening…</span> });

export function NewDesignButton() {
  const [open, setOpen] = useState(false);
  if (open) return <NewDesignForm onCancel={() => setOpen(false)} />;
  return (
    <button type="button" className="btn-primary" onClick={() => setOpen(true)} onPointerEnter={() => void loadForm()} onFocus={() => void loadForm()}>
      + New design
    </button>
  );
}
