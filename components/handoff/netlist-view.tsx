'use client';

import { useState } from 'react';

export function NetlistView({ text }: { text: string }) {
  const [copied, setCopied] = useState(false);
  return (
    <div className="relative">
      <button
        type="button"
        className="btn-secondary absolute right-2 top-2 py-1 text-xs"
        onClick={async () => {
          await navigator.clipboard?.writeText(text).catch(() => undefined);
          setCopied(true);
          setTimeout(() => setCopied(false), 1500);
        }}
      >
        {copied ? 'Copied' : 'Copy'}
      </button>
      <pre className="max-h-96 overflow-auto rounded-md bg-slate-900 p-4 font-mono text-xs leading-relaxed text-slate-100" data-testid="netlist">
        {text}
      </pre>
    </div>
  );
}
