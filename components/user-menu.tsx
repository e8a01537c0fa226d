'use client';

import { signOut } from 'next-auth/react';
import { useEffect, useRef, useState } from 'react';

export function UserMenu({ name, email, role }: { name: string; email: string; role: string }) {
  const [open, setOpen] = useState(false);
  const ref = useRef<HTMLDivElement>(null);
  useEffect(() => {
    const close = (e: MouseEvent) => {
      if (ref.current && !ref.current.contains(e.target as Node)) setOpen(false);
    };
    document.addEventListener('mousedown', close);
    return () => document.removeEventListener('mousedown', close);
  }, []);
  return (
    <div className="relative" ref={ref}>
      <button
        type="button"
        className="flex items-center gap-2 rounded-md px-2 py-1 text-sm hover:bg-frame-light"
        aria-haspopup="menu"
        aria-expanded={open}
        onClick={() => setOpen((o) => !o)}
      >
        <span className="flex h-7 w-7 items-center justify-center rounded-full bg-indigo-500 text-xs font-semibold text-white">
          {name.slice(0, 1).toUpperCase()}
        </span>
        <span className="hidden sm:inline">{name}</span>
        <span className="rounded bg-frame-light px-1.5 py-0.5 text-[11px] uppercase tracking-wide text-slate-200" data-testid="role-badge">
          {role}
        </span>
      </button>
      {open && (
        <div role="menu" className="absolute right-0 z-50 mt-2 w-56 rounded-md bg-white py-1 text-sm text-slate-800 shadow-lg ring-1 ring-black/5">
          <div className="border-b border-slate-100 px-3 py-2">
            <div className="font-medium">{name}</div>
            <div className="text-xs text-slate-500">{email}</div>
          </div>
          <button
            role="menuitem"
            type="button"
            className="block w-full px-3 py-2 text-left hover:bg-slate-50"
            onClick={() => signOut({ callbackUrl: '/signin' })}
          >
            Sign out
          </button>
        </div>
      )}
    </div>
  );
}
