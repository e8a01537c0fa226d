'use client';

import { useDeferredValue, useEffect, useMemo, useState } from 'react';
import { analyzeCorners, worstCaseChecks, type CornersResult } from '@/lib/engine/corners';
import type { MarginTargets, OperatingRange } from '@/lib/engine/range';
import { EngineInputError, type AnalyzeRequest, type Check, type FieldIssue } from '@/lib/engine/types';

export type CornersState = { ok: true; value: CornersResult; checks: Check[] } | { ok: false; issues: FieldIssue[] } | null;

/**
 * The corner sweep of the design as edited, in the page (32 analyses take a few tens of ms):
 * deferred so a drag or a keystroke is drawn first (and the page's first picture before them),
 * and held still while a handle is dragged.
 */
export function useCorners(request: AnalyzeRequest, range: OperatingRange, targets: MarginTargets, paused: boolean): CornersState {
  const trio = useMemo(() => ({ request, range, targets }), [request, range, targets]);
  // null on the first render (server and hydration): the corners follow in a background render,
  // so they never delay the page's first picture.
  const deferred = useDeferredValue<typeof trio | null>(trio, null);
  // Not before the page's first paint (Tune's first picture comes first), then in the background.
  const [painted, setPainted] = useState(false);
  useEffect(() => {
    let timer: ReturnType<typeof setTimeout> | undefined;
    const frame = requestAnimationFrame(() => (timer = setTimeout(() => setPainted(true), 0)));
    return () => {
      cancelAnimationFrame(frame);
      if (timer !== undefined) clearTimeout(timer);
    };
  }, []);
  const input = paused || !painted ? null : deferred;
  const last = useMemo<{ value: CornersState }>(() => ({ value: null }), []);
  const computed = useMemo<CornersState | undefined>(() => {
    if (!input) return undefined;
    try {
      const value = analyzeCorners(input.request, input.range, { loop: true });
      return { ok: true, value, checks: worstCaseChecks(value, input.targets) };
    } catch (err) {
      if (err instanceof EngineInputError) return { ok: false, issues: err.issues };
      return { ok: false, issues: [{ path: '(range)', message: err instanceof Error ? err.message : String(err) }] };
    }
  }, [input]);
  if (computed !== undefined) last.value = computed;
  return last.value;
}
