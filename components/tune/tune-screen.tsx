'use client';

import Link from 'next/link';
import { useCallback, useDeferredValue, useEffect, useMemo, useRef, useState } from 'react';
import { defaultCrossoverHz, placeForType, proposeForPlant } from '@/lib/engine/starting-point';
import { defaultSweep } from '@/lib/engine/sweep';
import { EngineInputError, type AnalyzeRequest, type CompensatorShape, type CompensatorType, type FieldIssue, type PartsOptions, type SweepOptions } from '@/lib/engine/types';
import { formatSi } from '@/lib/units/si';
import type { RevisionListItem, SavedRevision } from '@/lib/queries/revisions';
import { ChecksList } from './checks-list';
import { CompensatorTable } from './compensator-table';
import type { DragOffset, HandleMove } from './handle-overlay';
import { applyMove, compensatorFromShape, dragShape, handlesOf, partsOfType, shapeFromParts, withPart, type PartKey, type PartLock } from './handles';
import { canRedo, canUndo, commit, historyKey, redo, replace, settle, startHistory, undo, type History } from './history';
import { SweepForm } from './sweep-form';
import { sweepCovering } from './sweep-range';
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
import { withRange, type MarginTargets, type OperatingRange } from '@/lib/engine/range';
import { cornerTraces } from '@/components/range/corner-traces';
import { CornerViewToggle, RangePanel } from '@/components/range/range-panel';
import { useRangeAnalysis, type DesignInput } from '@/components/range/use-range-analysis';
import { WorstReadout } from '@/components/range/worst-readout';

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

const sameInput = (a: AnalyzeRequest, b: AnalyzeRequest) => a === b || stableJson(a) === stableJson(b);

export function TuneScreen({ designId, initialInput, savedInput, editFrom = null, shownRevision, latestRevision, mode, role, revisions }: TuneScreenProps) {
  // Scratch: any reader (viewer, reviewer, an earlier revision) edits and sees margins; nothing is saved.
  const [scratch, setScratch] = useState(false);
  const readOnly = mode !== 'edit' && !scratch;
  const bench = useBenchOverlay(designId); // Bench data overlay
  // Every edit on Tune goes through the history, so Ctrl+Z / Ctrl+Shift+Z undo and redo it.
  // The operating range is written out (defaults filled) so every save stores it; an older
  // revision without one opens with the defaults and is not counted as changed.
  const [history, setHistory] = useState<History<DesignInput>>(() => startHistory(withRange(initialInput)));
  const input = history.present;
  // The stage form keeps its own text; it is drawn again when undo, redo or leaving scratch change the stage under it.
  const [stageEpoch, setStageEpoch] = useState(0);
  const edit = useCallback((fn: (i: DesignInput) => DesignInput) => setHistory((h) => commit(h, fn(h.present), sameInput)), []);
  const setInput = edit;
  const dragCommitted = useRef(false);
  const [lockPart, setLockPart] = useState<PartKey>('r1');
  const [pmTarget, setPmTarget] = useState<number | null>(null);
  const [saved, setSaved] = useState(() => ({ json: stableJson(withRange(savedInput ?? initialInput)), revision: shownRevision }));
  const [from, setFrom] = useState(editFrom);
  const [stageValid, setStageValid] = useState(true);
  const [dragging, setDragging] = useState<string | null>(null);
  const [handleProblem, setHandleProblem] = useState<string | null>(null);
  const dragBase = useRef<CompensatorShape | null>(null);

  const { converter, modulator, feedback, sweep } = input;
  const stage = useMemo(() => ({ converter, modulator, feedback, sweep }), [converter, modulator, feedback, sweep]);
  const prepared = useMemo(() => prepareStage(stage), [stage]);
  // Stable callbacks keep the memoised stage form and parts table still while a handle is dragged.
  const onStageChange = useCallback((next: Pick<AnalyzeRequest, 'converter' | 'modulator' | 'feedback'>) => setInput((i) => ({ ...i, ...next })), [setInput]);
  const onSeriesChange = useCallback((options: PartsOptions) => setInput((i) => ({ ...i, parts: options })), [setInput]);
  const loop = useMemo(() => (prepared.ok ? analyzeCompensator(prepared.value, input.compensator) : null), [prepared, input.compensator]);
  // Snapped parts and their margins may lag a frame behind a drag.
  const deferredComp = useDeferredValue(input.compensator);
  const parts = useMemo(
    () => (prepared.ok ? analyzeCompensatorParts(prepared.value, deferredComp, input.parts) : null),
    [prepared, deferredComp, input.parts],
  );
  const shape = useMemo(() => shapeFromParts(input.compensator), [input.compensator]);
  const crossoverHz = loop?.ok ? loop.value.margins.crossoverHz : null;
  const sweepInUse: SweepOptions = prepared.ok ? prepared.value.sweep : (input.sweep ?? defaultSweep(input.converter.fsw));
  // A Type I gain handle stays at the LC resonance (or mid-sweep), so a gain change moves it only up or down.
  const anchorHz = prepared.ok ? (prepared.value.plant.resonanceHz ?? Math.sqrt(sweepInUse.fStart * sweepInUse.fStop)) : null;
  const handles = useMemo(() => handlesOf(shape, anchorHz), [shape, anchorHz]);
  const targetFcHz = prepared.ok ? defaultCrossoverHz(input.converter.fsw, prepared.value.plant.rhpZeroHz) : input.converter.fsw / 10;
  // The form's PM target starts at the design's own margin (rounded), so a type change keeps it.
  const startPm = useRef<number | null>(null);
  if (startPm.current === null && loop?.ok) {
    const pm = loop.value.margins.phaseMarginDeg;
    startPm.current = pm !== null && pm >= 30 && pm <= 80 ? Math.round(pm) : 60;
  }

  const onRangeChange = useCallback((next: { range: OperatingRange; targets: MarginTargets }) => setInput((i) => ({ ...i, ...next })), []);
  const across = useRangeAnalysis(input, dragging !== null || !prepared.ok);
  const cornerResult = across.corners?.ok ? across.corners.value : null;
  const rangeTraces = useMemo(
    () => (cornerResult && prepared.ok ? cornerTraces(prepared.value.grid.f as number[], cornerResult.corners, across.view, cornerResult.worst.phaseMarginDeg.corner) : undefined),
    [cornerResult, prepared, across.view],
  );

  const dirty = mode === 'edit' && (stableJson(input) !== saved.json || !stageValid);
  useLeaveGuard(dirty);

  const lock = useMemo<PartLock | null>(() => {
    const value = input.compensator[lockPart];
    return partsOfType(input.compensator.type).includes(lockPart) && value !== undefined && value > 0 ? { part: lockPart, value } : null;
  }, [input.compensator, lockPart]);

  /** Apply a new shape (the locked part holds); `during` marks the frames of a drag after its first. */
  const applyShape = useCallback(
    (next: CompensatorShape, during = false): string | null => {
      const r = compensatorFromShape(next, lock);
      if (!r.ok) {
        const message = r.issues[0]?.message ?? 'that placement is not possible';
        setHandleProblem(message);
        return message;
      }
      setHandleProblem(null);
      if (during) setHistory((h) => replace(h, { ...h.present, compensator: r.comp }));
      else setInput((i) => ({ ...i, compensator: r.comp }));
      return null;
    },
    [lock, setInput],
  );

  const onDragStart = (id: string) => {
    dragBase.current = shape;
    dragCommitted.current = false;
    setDragging(id);
  };
  const onDrag = (id: string, offset: DragOffset) => {
    // The first frame is one step in the history; the rest of the drag replaces it.
    const problem = applyShape(dragShape(dragBase.current ?? shape, id, offset.dxPx, offset.dyPx, offset.scale), dragCommitted.current);
    if (problem === null) dragCommitted.current = true;
  };
  const onDragEnd = () => {
    if (dragCommitted.current) setHistory((h) => settle(h, sameInput));
    dragBase.current = null;
    dragCommitted.current = false;
    setDragging(null);
  };
  const onStep = (id: string, move: HandleMove) => {
    applyShape(applyMove(shape, id, move));
  };

  const onPartChange = useCallback(
    (part: PartKey, value: number): string | null => {
      const r = withPart(input.compensator, part, value);
      if (!r.ok) return r.message;
      setHandleProblem(null);
      setInput((i) => ({ ...i, compensator: r.comp }));
      return null;
    },
    [input.compensator, setInput],
  );

  const onSweepChange = (next: SweepOptions | undefined): string | null => {
    setInput((i) => {
      const { sweep: _drop, ...rest } = i;
      return next ? { ...rest, sweep: next } : rest;
    });
    return null;
  };
  const onWidenSweep = bench ? () => onSweepChange(sweepCovering(sweepInUse, bench)) : undefined;

  const doUndo = useCallback(() => {
    setHistory((h) => undo(h));
    setStageEpoch((n) => n + 1);
  }, []);
  const doRedo = useCallback(() => {
    setHistory((h) => redo(h));
    setStageEpoch((n) => n + 1);
  }, []);
  useEffect(() => {
    if (readOnly) return;
    const onKey = (e: KeyboardEvent) => {
      const which = historyKey(e);
      if (!which) return;
      // Inside a text field the browser's own undo edits the text.
      const t = e.target as HTMLElement | null;
      if (t && (t.tagName === 'TEXTAREA' || (t.tagName === 'INPUT' && !['radio', 'checkbox'].includes((t as HTMLInputElement).type)))) return;
      e.preventDefault();
      if (which === 'undo') doUndo();
      else doRedo();
    };
    window.addEventListener('keydown', onKey);
    return () => window.removeEventListener('keydown', onKey);
  }, [readOnly, doUndo, doRedo]);

  const startScratch = () => setScratch(true);
  const leaveScratch = () => {
    setScratch(false);
    setHistory(startHistory(withRange(initialInput)));
    setStageEpoch((n) => n + 1);
    setHandleProblem(null);
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
    if (!prepared.ok) return 'Fix the power stage first: the loop cannot be placed without it.';
    // Keep the crossover as it is and the phase margin target of the starting point.
    const fc = crossoverHz ?? targetFcHz;
    const pm = pmTarget ?? startPm.current ?? 60;
    try {
      const placed = placeForType(prepared.value, { type, crossoverHz: fc, phaseMarginDeg: pm, r1: input.compensator.r1 });
      setHandleProblem(null);
      setInput((i) => ({ ...i, compensator: placed.compensator }));
      return placed.note ?? `Placed for the same fc (${formatSi(fc, 'Hz')}) and PM target (${pm.toFixed(0)}°).`;
    } catch (err) {
      return firstMessage(err);
    }
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
    <div className={`space-y-4 ${scratch ? 'rounded-lg outline-dashed outline-2 outline-offset-4 outline-amber-500' : ''}`} data-testid="tune" data-mode={mode} data-scratch={scratch || undefined}>
      <div className="card flex flex-wrap items-center gap-x-6 gap-y-2 px-4 py-3">
        <RevisionPicker designId={designId} shown={shownRevision} initial={revisions} />
        {!readOnly && (
          <div className="flex items-center gap-1" role="group" aria-label="Undo and redo">
            <button type="button" className="btn-secondary px-2 py-1 text-xs" onClick={doUndo} disabled={!canUndo(history)} title="Undo the last edit (Ctrl+Z)" data-testid="undo">
              ↶ Undo
            </button>
            <button type="button" className="btn-secondary px-2 py-1 text-xs" onClick={doRedo} disabled={!canRedo(history)} title="Redo (Ctrl+Shift+Z)" data-testid="redo">
              ↷ Redo
            </button>
          </div>
        )}
        <div className="min-w-[20rem] flex-1">
          {scratch ? (
            <div className="flex flex-wrap items-center justify-between gap-x-4 gap-y-2 rounded-md bg-amber-50 px-3 py-2" role="status" data-testid="scratch-banner">
              <p className="text-sm text-amber-900">
                <strong className="mr-1 rounded bg-amber-500 px-1.5 py-0.5 text-xs font-bold uppercase tracking-wide text-white">Scratch</strong>
                A what-if on {shownRevision ? `r${shownRevision}` : 'this design'}: edit and watch the margins. Nothing is saved, and nothing you do here changes the design.
              </p>
              <button type="button" className="btn-secondary" onClick={leaveScratch} data-testid="scratch-leave">
                Leave scratch (discard)
              </button>
            </div>
          ) : mode === 'edit' ? (
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
              Read-only: your role (<strong>{role}</strong>) may look at designs but not change them.{' '}
              <button type="button" className="text-indigo-700 underline" onClick={startScratch} data-testid="scratch-start">
                Try a what-if in Scratch
              </button>{' '}
              (nothing is saved).
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
              <button type="button" className="btn-secondary" onClick={startScratch} data-testid="scratch-start" title="Edit this revision and see its margins; nothing is saved">
                Scratch on r{shownRevision}
              </button>
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
              sweep={sweepInUse}
              onWidenSweep={onWidenSweep}
              holdRangesKey={`${stableJson({ converter, modulator, feedback })}|${stableJson(sweepInUse)}|${input.compensator.type}`}
              dragging={dragging !== null}
              readOnly={readOnly}
              onDragStart={onDragStart}
              onDrag={onDrag}
              onDragEnd={onDragEnd}
              onStep={onStep}
              bench={bench}
              rangeTraces={rangeTraces}
              rangeToggle={cornerResult && <CornerViewToggle view={across.view} onChange={across.setView} count={cornerResult.corners.length} />}
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
              <>
                <MarginsReadout
                  margins={result.margins}
                  phaseAtHalfFswDeg={result.phaseAtHalfFswDeg}
                  fsw={input.converter.fsw}
                  snapped={parts?.snappedMargins ?? null}
                  crossoverAboveHz={result.bode.loop.magDb[result.bode.loop.magDb.length - 1] > 0 ? result.bode.f[result.bode.f.length - 1] : null}
                />
                <div className="mt-3 border-t border-slate-200 pt-3">
                  <WorstReadout nominal={result.margins} corners={cornerResult} spread={across.spread.status === 'done' && !across.stale ? across.spread.result : null} targets={input.targets} />
                </div>
              </>
            ) : (
              <p className="text-sm text-slate-500">—</p>
            )}
          </Card>
          <Card title="Checks" aside={result && <span className="text-xs text-slate-500">{result.checks.length + (across.corners?.ok ? across.corners.checks.length : 0)} raised</span>}>
            {result ? <ChecksList checks={across.corners?.ok ? [...result.checks, ...across.corners.checks] : result.checks} /> : <p className="text-sm text-slate-500">Checks appear once the loop can be analysed.</p>}
          </Card>
        </div>
      </div>

      <div className="grid items-start gap-4 lg:grid-cols-2 xl:grid-cols-3">
        <Card title="Power stage" aside={<span className="text-xs text-slate-500">{input.converter.topology}, voltage-mode</span>}>
          <StageForm key={stageEpoch} value={stage} readOnly={readOnly} issues={stageIssues} onChange={onStageChange} onValidityChange={setStageValid} />
        </Card>
        <Card title="Compensator handles">
          <CompensatorTable
            shape={shape}
            handles={handles}
            readOnly={readOnly}
            onShape={applyShape}
            onStep={onStep}
            onTypeChange={onTypeChange}
          />
          {!readOnly && (
            <details className="mt-4 rounded-md border border-slate-200 p-3" open={saved.revision === null}>
              <summary className="cursor-pointer text-sm font-semibold text-slate-800">Starting point</summary>
              <div className="mt-3">
                <StartingPointForm
                  defaultCrossoverHz={targetFcHz}
                  defaultPhaseMarginDeg={startPm.current ?? 60}
                  type={input.compensator.type}
                  onPropose={propose}
                  onPhaseMarginTarget={setPmTarget}
                />
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
              lock={lock?.part ?? 'r1'}
              onSeriesChange={onSeriesChange}
              onPartChange={onPartChange}
              onLockChange={setLockPart}
            />
          ) : (
            <p className="text-sm text-slate-500">Parts appear once the power stage is valid.</p>
          )}
        </Card>
        <Card title="Sweep">
          <SweepForm sweep={sweepInUse} custom={input.sweep !== undefined} fsw={input.converter.fsw} readOnly={readOnly} onChange={onSweepChange} />
        </Card>
      </div>

      <RangePanel
        range={input.range}
        targets={input.targets}
        seriesTol={across.seriesTol}
        readOnly={readOnly}
        corners={across.corners}
        spread={across.spread}
        stale={across.stale}
        onChange={onRangeChange}
        onRun={across.runSpread}
        onCancel={across.cancelSpread}
      />
    </div>
  );
}
