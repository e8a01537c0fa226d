'use client';

import Link from 'next/link';
import { useCallback, useDeferredValue, useMemo, useRef, useState } from 'react';
import { proposeForPlant } from '@/lib/engine/starting-point';
import { EngineInputError, type AnalyzeRequest, type CompensatorShape, type CompensatorType, type FieldIssue, type PartsOptions } from '@/lib/engine/types';
import type { RevisionListItem, SavedRevision } from '@/lib/queries/revisions';
import { ChecksList } from './checks-list';
import { CompensatorTable } from './compensator-table';
import type { HandleMove } from './handle-overlay';
import { compensatorFromShape, handlesOf, moveFrequency, shapeFromParts, shiftGain } from './handles';
import { MarginsReadout } from './margins-readout';
import { PartsTable } from './parts-table';
import { RevisionPicker } from './revision-picker';
import { SaveBar } from './save-bar';
import { StageForm } from './stage-form';
import { StartingPointForm, type StartingPointRequest } from './starting-point-form';
import { analyzeCompensator, analyzeCompensatorParts, prepareStage } from './tune-analysis';
import { TunePlot } from './tune-plot';
import { useBenchOverlay } from '@/lib/queries/bench';
import { useLeaveGuard } from './use-leave-guard';

export type TuneMode = 'edit' | 'role-read-only' | 'earlier-revision';

export interface TuneScreenProps {
  designId: number;
  /** What the editor starts with: the shown revision's input, or an earlier one's when editing from it. */
  initialInput: AnalyzeRequest;
  /** The shown revision's own input, to tell unsaved changes by (default: initialInput). */
  savedInput?: AnalyzeRequest;
  /** Editing from this earlier revision: its input is loaded on top of the latest as unsaved changes. */
  editFrom?: number | null;
  /** The revision shown; null for a design with none saved yet. */
  shownRevision: number | null;
  latestRevision: number | null;
  mode: TuneMode;
  role: string;
  revisions: Pick<RevisionListItem, 'number' | 'note' | 'authorName' | 'createdAt'>[];
}

/** JSON with sorted keys, so two inputs compare equal whatever order their keys were written in. */
function stableJson(v: unknown): string {
  return JSON.stringify(v, (_k, val) =>
    val && typeof val === 'object' && !Array.isArray(val) ? Object.fromEntries(Object.entries(val).sort(([a], [b]) => a.localeCompare(b))) : val,
  );
}

const NO_ISSUES: FieldIssue[] = [];

const firstMessage = (err: unknown) => (err instanceof EngineInputError ? err.issues[0]?.message ?? err.message : err instanceof Error ? err.message : String(err));

function Card({ title, children, className = '', aside }: { title: string; children: React.ReactNode; className?: string; aside?: React.ReactNode }) {
  return (
    <section className={`card p-4 ${className}`} aria-label={title}>
      <div className="mb-3 flex items-baseline justify-between gap-2">
        <h2 className="text-sm font-semibold text-slate-800">{title}</h2>
        {aside}
      </div>
      {children}
    </section>
  );
}

export function TuneScreen({ designId, initialInput, savedInput, editFrom = null, shownRevision, latestRevision, mode, role, revisions }: TuneScreenProps) {
  const readOnly = mode !== 'edit';
  const bench = useBenchOverlay(designId, shownRevision); // the shown revision's bench data (Handoff)
  const [input, setInput] = useState<AnalyzeRequest>(initialInput);
  const [saved, setSaved] = useState({ json: stableJson(savedInput ?? initialInput), revision: shownRevision });
  const [from, setFrom] = useState(editFrom);
  const [stageValid, setStageValid] = useState(true);
  const [dragging, setDragging] = useState<string | null>(null);
  const [handleProblem, setHandleProblem] = useState<string | null>(null);
  const dragBase = useRef<CompensatorShape | null>(null);

  const { converter, modulator, feedback, sweep } = input;
  const stage = useMemo(() => ({ converter, modulator, feedback, sweep }), [converter, modulator, feedback, sweep]);
  const prepared = useMemo(() => prepareStage(stage as AnalyzeRequest), [stage]);
  // Stable callbacks keep the memoised stage form and parts table still while a handle is dragged.
  const onStageChange = useCallback((next: Pick<AnalyzeRequest, 'converter' | 'modulator' | 'feedback'>) => setInput((i) => ({ ...i, ...next })), []);
  const onSeriesChange = useCallback((options: PartsOptions) => setInput((i) => ({ ...i, parts: options })), []);
  const loop = useMemo(() => (prepared.ok ? analyzeCompensator(prepared.value, input.compensator) : null), [prepared, input.compensator]);
  // Snapped parts and their margins may lag a frame behind a drag.
  const deferredComp = useDeferredValue(input.compensator);
  const parts = useMemo(
    () => (prepared.ok ? analyzeCompensatorParts(prepared.value, deferredComp, input.parts) : null),
    [prepared, deferredComp, input.parts],
  );
  const shape = useMemo(() => shapeFromParts(input.compensator), [input.compensator]);
  const crossoverHz = loop?.ok ? loop.value.margins.crossoverHz : null;
  const handles = useMemo(() => handlesOf(shape, crossoverHz), [shape, crossoverHz]);

  const dirty = !readOnly && (stableJson(input) !== saved.json || !stageValid);
  useLeaveGuard(dirty);

  const applyShape = useCallback((next: CompensatorShape): string | null => {
    const r = compensatorFromShape(next);
    if (!r.ok) {
      const message = r.issues[0]?.message ?? 'that placement is not possible';
      setHandleProblem(message);
      return message;
    }
    setHandleProblem(null);
    setInput((i) => ({ ...i, compensator: r.comp }));
    return null;
  }, []);

  const moved = (base: CompensatorShape, id: string, move: HandleMove) =>
    id === 'gain' ? shiftGain(base, move.deltaDb ?? 0) : move.hz !== undefined ? moveFrequency(base, id, move.hz) : base;

  const onDragStart = (id: string) => {
    dragBase.current = shape;
    setDragging(id);
  };
  const onDrag = (id: string, move: HandleMove) => {
    applyShape(moved(dragBase.current ?? shape, id, move));
  };
  const onDragEnd = () => {
    dragBase.current = null;
    setDragging(null);
  };
  const onStep = (id: string, move: HandleMove) => {
    applyShape(moved(shape, id, move));
  };

  const propose = (target: Omit<StartingPointRequest, 'type'> & { type: CompensatorType }): string | null => {
    if (!prepared.ok) return 'Fix the power stage first: the loop cannot be placed without it.';
    try {
      const comp = proposeForPlant(prepared.value, { ...target, r1: input.compensator.r1 });
      setHandleProblem(null);
      setInput((i) => ({ ...i, compensator: comp }));
      return null;
    } catch (err) {
      return firstMessage(err);
    }
  };

  const onTypeChange = (type: CompensatorType): string | null => {
    const fsw = input.converter.fsw;
    const base = { crossoverHz: crossoverHz ?? fsw / 10, phaseMarginDeg: 55, type };
    // The K factor cannot reach every target (e.g. Type I); the pole-zero rules always place something.
    const kFactor = propose({ ...base, method: 'k-factor' });
    if (kFactor === null) return null;
    const poleZero = propose({ ...base, method: 'pole-zero' });
    return poleZero ?? `The K factor could not place it (${kFactor}), so the pole-zero rules did: check the margins.`;
  };

  const onSaved = (rev: SavedRevision, savedInput: AnalyzeRequest) => {
    setSaved({ json: stableJson(savedInput), revision: rev.number });
    if (from !== null) {
      setFrom(null);
      // The address no longer asks to load the earlier revision (before SaveBar refreshes the page).
      window.history.replaceState(null, '', `/designs/${designId}`);
    }
  };

  const stageIssues = prepared.ok ? NO_ISSUES : prepared.issues;
  const blockedBy = !stageValid
    ? 'A power-stage field holds text that is not a number; fix it to save.'
    : !prepared.ok
      ? 'The power stage is not physically possible as entered; fix the fields marked in red.'
      : loop && !loop.ok
        ? `The compensator is not possible: ${loop.issues[0]?.message}`
        : null;

  const result = loop?.ok ? loop.value : null;

  return (
    <div className="space-y-4" data-testid="tune" data-mode={mode}>
      <div className="card flex flex-wrap items-center gap-x-6 gap-y-2 px-4 py-3">
        <RevisionPicker designId={designId} shown={shownRevision} initial={revisions} />
        <div className="min-w-[20rem] flex-1">
          {mode === 'edit' ? (
            <>
              <SaveBar
                designId={designId}
                input={input}
                baseRevision={saved.revision}
                dirty={dirty}
                blockedBy={blockedBy}
                onSaved={onSaved}
                initialNote={from !== null ? `From r${from}: ` : ''}
              />
              {from !== null && (
                <p className="mt-2 text-sm text-slate-600" data-testid="edit-from-note">
                  <strong>r{from}</strong>&apos;s input is loaded as unsaved changes on top of r{saved.revision}, the latest. Saving makes r
                  {(saved.revision ?? 0) + 1}; r{from} stays as it was.{' '}
                  <Link className="text-indigo-700 underline" href={`/designs/${designId}`}>
                    Discard and go back to r{saved.revision}
                  </Link>
                </p>
              )}
            </>
          ) : mode === 'role-read-only' ? (
            <p className="text-sm text-slate-600" data-testid="read-only-note">
              Read-only: your role (<strong>{role}</strong>) may look at designs but not change them. Handles and fields are fixed.
            </p>
          ) : (
            <div className="flex flex-wrap items-center justify-between gap-x-4 gap-y-2">
              <p className="text-sm text-slate-600" data-testid="read-only-note">
                r{shownRevision} is an earlier revision and opens read-only.{' '}
                <Link className="text-indigo-700 underline" href={`/designs/${designId}`}>
                  Go to the latest (r{latestRevision})
                </Link>
                , or start from this one.
              </p>
              <Link
                className="btn-secondary"
                href={`/designs/${designId}?from=${shownRevision}`}
                title={`Load r${shownRevision}'s input into the editor as unsaved changes on top of r${latestRevision}; nothing is overwritten`}
                data-testid="edit-from"
              >
                Edit from r{shownRevision}
              </Link>
            </div>
          )}
        </div>
      </div>

      <div className="grid items-start gap-4 xl:grid-cols-[minmax(0,1fr)_22rem]">
        <section className="card p-3" aria-label="Bode plot">
          {result && prepared.ok ? (
            <TunePlot
              bode={result.bode}
              margins={result.margins}
              plant={prepared.value.plant}
              handles={handles}
              midbandGainDb={result.compensator.midbandGainDb}
              dragging={dragging !== null}
              readOnly={readOnly}
              onDragStart={onDragStart}
              onDrag={onDrag}
              onDragEnd={onDragEnd}
              onStep={onStep}
              bench={bench}
            />
          ) : (
            <div className="grid h-[480px] place-items-center text-center text-sm text-slate-500" data-testid="plot-unavailable">
              <div>
                <p className="font-medium text-slate-700">No loop to plot</p>
                <ul className="mt-1 space-y-0.5">
                  {(prepared.ok ? (loop && !loop.ok ? loop.issues : []) : prepared.issues).map((i) => (
                    <li key={i.path + i.message}>{i.message}</li>
                  ))}
                </ul>
              </div>
            </div>
          )}
          {handleProblem && (
            <p className="mt-1 px-1 text-xs text-amber-800" role="status" data-testid="handle-problem">
              Handle stopped: {handleProblem}
            </p>
          )}
        </section>
        <div className="space-y-4">
          <Card title="Margins">
            {result ? (
              <MarginsReadout margins={result.margins} phaseAtHalfFswDeg={result.phaseAtHalfFswDeg} fsw={input.converter.fsw} snapped={parts?.snappedMargins ?? null} />
            ) : (
              <p className="text-sm text-slate-500">—</p>
            )}
          </Card>
          <Card title="Checks" aside={result && <span className="text-xs text-slate-500">{result.checks.length} raised</span>}>
            {result ? <ChecksList checks={result.checks} /> : <p className="text-sm text-slate-500">Checks appear once the loop can be analysed.</p>}
          </Card>
        </div>
      </div>

      <div className="grid items-start gap-4 lg:grid-cols-2 xl:grid-cols-3">
        <Card title="Power stage" aside={<span className="text-xs text-slate-500">{input.converter.topology}, voltage-mode</span>}>
          <StageForm value={stage} readOnly={readOnly} issues={stageIssues} onChange={onStageChange} onValidityChange={setStageValid} />
        </Card>
        <Card title="Compensator handles">
          <CompensatorTable
            shape={shape}
            handles={handles}
            midbandGainDb={result?.compensator.midbandGainDb ?? null}
            readOnly={readOnly}
            onShape={applyShape}
            onStep={onStep}
            onTypeChange={onTypeChange}
          />
          {!readOnly && (
            <details className="mt-4 rounded-md border border-slate-200 p-3" open={saved.revision === null}>
              <summary className="cursor-pointer text-sm font-semibold text-slate-800">Starting point</summary>
              <div className="mt-3">
                <StartingPointForm fsw={input.converter.fsw} type={input.compensator.type} onPropose={propose} />
              </div>
            </details>
          )}
        </Card>
        <Card title="Parts">
          {parts ? (
            <PartsTable
              parts={parts}
              topology={input.converter.topology}
              readOnly={readOnly}
              onSeriesChange={onSeriesChange}
            />
          ) : (
            <p className="text-sm text-slate-500">Parts appear once the power stage is valid.</p>
          )}
        </Card>
      </div>
    </div>
  );
}
