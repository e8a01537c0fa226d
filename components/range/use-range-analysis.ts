'use client';

import { useCallback, useMemo, useState } from 'react';
import { partsTolerances, type MarginTargets, type OperatingRange } from '@/lib/engine/range';
import type { AnalyzeRequest } from '@/lib/engine/types';
import type { CornerView } from './corner-traces';
import type { SpreadRequest } from './spread-panel';
import { useCorners } from './use-corners';
import { useSpread } from './use-spread';

export type DesignInput = AnalyzeRequest & { range: OperatingRange; targets: MarginTargets };

const keyOf = (request: AnalyzeRequest, range: OperatingRange) => JSON.stringify([request.converter, request.modulator, request.compensator, request.parts ?? null, range]);

/** Corners (live, in the page) and the spread (on demand, in a worker) of the design as edited. */
export function useRangeAnalysis(input: DesignInput, paused: boolean) {
  const { range, targets } = input;
  const corners = useCorners(input, range, targets, paused);
  const spread = useSpread();
  const [ranFor, setRanFor] = useState<string | null>(null);
  const [view, setView] = useState<CornerView>('band');
  const run = useCallback(
    (r: SpreadRequest) => {
      setRanFor(keyOf(input, range));
      spread.run(input, range, { ...r, targets });
    },
    [input, range, targets, spread],
  );
  const stale = ranFor !== null && ranFor !== keyOf(input, range);
  const seriesTol = useMemo(() => partsTolerances({ ...range, parts: undefined }, input.parts), [range, input.parts]);
  return { corners, spread: spread.state, runSpread: run, cancelSpread: spread.cancel, stale, view, setView, seriesTol };
}
