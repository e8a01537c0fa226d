'use client';

import Link from 'next/link';
import { useCallback, useDeferredValue, useEffect, useMemo, useReducer, useRef } from 'react';
import { dividerRb } from '@/lib/engine/compensator';
import type { MarginTargets, OperatingRange } from '@/lib/engine/range';
import { defaultCrossoverHz } from '@/lib/engine/starting-point';
import { defaultSweep } from '@/lib/engine/sweep';
import type { AnalyzeRequest, CompensatorShape, CompensatorType, FieldIssue, PartsOptions, SweepOptions } from '@/lib/engine/types';
import { MODULATOR_MODE_LABELS } from '@/lib/catalog';
import { useBenchOverlay } from '@/lib/queries/bench';
import type { RevisionBriefPage, SavedRevision } from '@/lib/queries/revisions';
import { cornerTraces } from '@/components/range/corner-traces';
import { CornerViewToggle, RangePanel } from '@/components/range/range-panel';
import { useRangeAnalysis } from '@/components/range/use-range-analysis';
import { WorstReadout } from '@/components/range/worst-readout';
import { TimeDomainView } from '@/components/time-domain/time-domain-view';
import { TuneViewSwitch, type TuneView } from '@/components/time-domain/tune-view-switch';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { AmplifierForm, type AmplifierValues } from './amplifier-form';
import { ChecksList } from './checks-list';
import { CompensatorTable } from './compensator-table';
import type { DragOffset, HandleMove } from './handle-overlay';
import { applyMove, compensatorFromShape, handlesOf, shapeFromParts, withPart, type PartKey } from './handles';
import { MarginsReadout } from './margins-readout';
import { PartsTable } from './parts-table';
import { RevisionPicker } from './revision-picker';
import { SaveBar } from './save-bar';
import { StageForm } from './stage-form';
import { StartingPointForm, type StartingPointRequest } from './starting-point-form';
import { SweepForm } from './sweep-form';
import { sweepCovering } from './sweep-range';
import { analyzeCompensator, analyzeCompensatorParts, prepareStage } from './tune-analysis';
import { TunePlot } from './tune-plot';
import {
  canRedo,
  canUndo,
  changeAmplifier,
  historyKey,
  initTuneState,
  isDirty,
  lockOf,
  placeType,
  proposeStart,
  stableJson,
  tuneReducer,
  type Placed,
  type StageEdit,
} from './tune-state';
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
  /** The page of revisions (100, newest first) that holds the one shown. */
  revisions: RevisionBriefPage;
}

const NO_ISSUES: FieldIssue[] = [];

export function TuneScreen({ designId, initialInput, savedInput, editFrom = null, shownRevision, latestRevision, mode, role, revisions }: TuneScreenProps) {
  // All of the screen's own state, and every change to it, is in tune-state.ts.
  const [state, dispatch] = useReducer(tuneReducer, { initialInput, savedInput, shownRevision, editFrom }, initTuneState);
  const { input, scratch, view } = state;
  const readOnly = mode !== 'edit' && !scratch;
  const dragging = state.drag !== null;
  const bench = useBenchOverlay(designId, shownRevision); // the shown revision's bench data

  // What the engine makes of the input, memoised per part of it: the stage is prepared once per
  // stage change, the loop once per compensator change (every frame of a drag).
  const { converter, modulator, feedback, sweep } = input;
  const stage = useMemo(() => ({ converter, modulator, feedback, sweep }), [converter, modulator, feedback, sweep]);
  const prepared = useMemo(() => prepareStage(stage), [stage]);
  const plant = prepared.ok ? prepared.value : null;
  const loop = useMemo(() => (plant ? analyzeCompensator(plant, input.compensator) : null), [plant, input.compensator]);
  // Snapped parts and their margins may lag a frame behind a drag.
  const deferredComp = useDeferredValue(input.compensator);
  const parts = useMemo(() => (plant ? analyzeCompensatorParts(plant, deferredComp, input.parts) : null), [plant, deferredComp, input.parts]);
  const shape = useMemo(() => shapeFromParts(input.compensator), [input.compensator]);
  const crossoverHz = loop?.ok ? loop.value.margins.crossoverHz : null;
  const sweepInUse: SweepOptions = plant ? plant.sweep : (input.sweep ?? defaultSweep(input.converter.fsw));
  // A Type I gain handle stays at the LC resonance (or mid-sweep), so a gain change moves it only up or down.
  const anchorHz = plant ? (plant.plant.resonanceHz ?? Math.sqrt(sweepInUse.fStart * sweepInUse.fStop)) : null;
  const handles = useMemo(() => handlesOf(shape, anchorHz), [shape, anchorHz]);
  const targetFcHz = plant ? defaultCrossoverHz(input.converter.fsw, plant.plant.rhpZeroHz) : input.converter.fsw / 10;
  // The form's PM target starts at the design's own margin (rounded), so a type change keeps it.
  const startPm = useRef<number | null>(null);
  if (startPm.current === null && loop?.ok) {
    const pm = loop.value.margins.phaseMarginDeg;
    startPm.current = pm !== null && pm >= 30 && pm <= 80 ? Math.round(pm) : 60;
  }

  const across = useRangeAnalysis(input, dragging || !prepared.ok);
  const cornerResult = across.corners?.ok ? across.corners.value : null;
  const rangeTraces = useMemo(
    () => (cornerResult && plant ? cornerTraces(plant.grid.f as number[], cornerResult.corners, across.view, cornerResult.worst.phaseMarginDeg.corner) : undefined),
    [cornerResult, plant, across.view],
  );

  const dirty = mode === 'edit' && isDirty(state);
  useLeaveGuard(dirty);
  const lock = lockOf(state);

  // Stable callbacks (dispatch never changes) keep the memoised forms still while a handle is dragged.
  const onStageChange = useCallback((stage: StageEdit) => dispatch({ type: 'edit-stage', stage }), []);
  const onStageValidity = useCallback((valid: boolean) => dispatch({ type: 'stage-validity', valid }), []);
  const onSeriesChange = useCallback((parts: PartsOptions) => dispatch({ type: 'edit-series', parts }), []);
  const onStepChange = useCallback((step: NonNullable<AnalyzeRequest['step']>) => dispatch({ type: 'edit-step', step }), []);
  const onRangeChange = useCallback((next: { range: OperatingRange; targets: MarginTargets }) => dispatch({ type: 'edit-range', ...next }), []);
  const onLockChange = useCallback((part: PartKey) => dispatch({ type: 'lock', part }), []);
  const onPmTarget = useCallback((deg: number | null) => dispatch({ type: 'pm-target', deg }), []);
  const onView = useCallback((view: TuneView) => dispatch({ type: 'view', view }), []);
  const onDragStart = useCallback((id: string) => dispatch({ type: 'drag-start', id }), []);
  const onDrag = useCallback((_id: string, o: DragOffset) => dispatch({ type: 'drag-move', dxPx: o.dxPx, dyPx: o.dyPx, scale: o.scale }), []);
  const onDragEnd = useCallback(() => dispatch({ type: 'drag-end' }), []);
  const doUndo = useCallback(() => dispatch({ type: 'undo' }), []);
  const doRedo = useCallback(() => dispatch({ type: 'redo' }), []);

  /** Controls that answer at once (the handle table, the type, a part): the message to show beside them, or null. */
  const applyShape = (next: CompensatorShape): string | null => {
    const r = compensatorFromShape(next, lock);
    if (!r.ok) {
      const message = r.issues[0]?.message ?? 'that placement is not possible';
      dispatch({ type: 'refuse', message });
      return message;
    }
    dispatch({ type: 'set-compensator', compensator: r.comp });
    return null;
  };
  const onStep = (id: string, move: HandleMove) => {
    applyShape(applyMove(shape, id, move));
  };
  const place = (r: Placed): string | null => {
    if (!r.ok) return r.message;
    dispatch({ type: 'set-compensator', compensator: r.compensator });
    return r.note;
  };
  const onPartChange = useCallback(
    (part: PartKey, value: number): string | null => {
      const r = withPart(input.compensator, part, value);
      if (!r.ok) return r.message;
      dispatch({ type: 'set-compensator', compensator: r.comp });
      return null;
    },
    [input.compensator],
  );
  const onAmplifierChange = useCallback((values: AmplifierValues) => place(changeAmplifier(input.compensator, values)), [input.compensator]);
  // Keep the crossover as it is and the phase margin target of the starting point.
  const onTypeChange = (type: CompensatorType) =>
    place(placeType(plant, input.compensator, type, { crossoverHz: crossoverHz ?? targetFcHz, phaseMarginDeg: state.pmTargetDeg ?? startPm.current ?? 60 }));
  const propose = (target: Omit<StartingPointRequest, 'type'> & { type: CompensatorType }) => place(proposeStart(plant, input.compensator, target));
  const onSweepChange = (next: SweepOptions | undefined): string | null => {
    dispatch({ type: 'edit-sweep', sweep: next });
    return null;
  };
  const onWidenSweep = bench ? () => onSweepChange(sweepCovering(sweepInUse, bench)) : undefined;

  useEffect(() => {
    if (readOnly) return;
    const onKey = (e: KeyboardEvent) => {
      const which = historyKey(e);
      if (!which) return;
      // Inside a text field the browser's own undo edits the text.
      const t = e.target as HTMLElement | null;
      if (t && (t.tagName === 'TEXTAREA' || (t.tagName === 'INPUT' && !['radio', 'checkbox'].includes((t as HTMLInputElement).type)))) return;
      e.preventDefault();
      dispatch({ type: which });
    };
    window.addEventListener('keydown', onKey);
    return () => window.removeEventListener('keydown', onKey);
  }, [readOnly]);

  const startScratch = () => dispatch({ type: 'start-scratch' });
  const leaveScratch = () => dispatch({ type: 'leave-scratch' });

  const onSaved = (rev: SavedRevision, savedInput: AnalyzeRequest) => {
    // The address no longer asks to load the earlier revision (before SaveBar refreshes the page).
    if (state.editFrom !== null) window.history.replaceState(null, '', `/designs/${designId}`);
    dispatch({ type: 'saved', revision: rev.number, input: savedInput });
  };
  const from = state.editFrom;
  const saved = state.saved;

  const stageIssues = prepared.ok ? NO_ISSUES : prepared.issues;
  const blockedBy = !state.stageValid
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
        <RevisionPicker key={shownRevision ?? 0} designId={designId} shown={shownRevision} initial={revisions} />
        {!readOnly && (
          <div className="flex items-center gap-1" role="group" aria-label="Undo and redo">
            <Button size="sm" onClick={doUndo} disabled={!canUndo(state)} title="Undo the last edit (Ctrl+Z)" data-testid="undo">
              ↶ Undo
            </Button>
            <Button size="sm" onClick={doRedo} disabled={!canRedo(state)} title="Redo (Ctrl+Shift+Z)" data-testid="redo">
              ↷ Redo
            </Button>
          </div>
        )}
        <div className="min-w-[20rem] flex-1">
          {scratch ? (
            <div className="flex flex-wrap items-center justify-between gap-x-4 gap-y-2 rounded-md bg-amber-50 px-3 py-2" role="status" data-testid="scratch-banner">
              <p className="text-sm text-amber-900">
                <strong className="mr-1 rounded bg-amber-500 px-1.5 py-0.5 text-xs font-bold uppercase tracking-wide text-white">Scratch</strong>
                A what-if on {shownRevision ? `r${shownRevision}` : 'this design'}: edit and watch the margins. Nothing is saved, and nothing you do here changes the design.
              </p>
              <Button onClick={leaveScratch} data-testid="scratch-leave">
                Leave scratch (discard)
              </Button>
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
              <Button variant="link" onClick={startScratch} data-testid="scratch-start">
                Try a what-if in Scratch
              </Button>{' '}
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
              <Button onClick={startScratch} data-testid="scratch-start" title="Edit this revision and see its margins; nothing is saved">
                Scratch on r{shownRevision}
              </Button>
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

      <TuneViewSwitch view={view} onView={onView} />
      {view === 'time' && <TimeDomainView input={input} bode={result?.bode ?? null} readOnly={readOnly} onStepChange={onStepChange} />}
      <div className={`grid items-start gap-4 xl:grid-cols-[minmax(0,1fr)_22rem] ${view === 'loop' ? '' : 'hidden'}`}>
        <section className="card p-3" aria-label="Bode plot">
          {result && prepared.ok ? (
            <TunePlot
              bode={result.bode}
              margins={result.margins}
              plant={prepared.value.plant}
              modulator={prepared.value.modulator}
              dcmPoleHz={prepared.value.dcmPoleHz}
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
          {state.handleProblem && (
            <p className="mt-1 px-1 text-xs text-amber-800" role="status" data-testid="handle-problem">
              Handle stopped: {state.handleProblem}
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
        <Card title="Power stage" aside={<span className="text-xs text-slate-500">{input.converter.topology}, {MODULATOR_MODE_LABELS[input.modulator.mode ?? 'voltage'].toLowerCase()}</span>}>
          <StageForm key={state.stageEpoch} value={stage} readOnly={readOnly} issues={stageIssues} onChange={onStageChange} onValidityChange={onStageValidity} />
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
          <div className="mt-4">
            <AmplifierForm
              key={`${state.stageEpoch}|${input.compensator.amplifier ?? 'opamp'}`}
              compensator={input.compensator}
              rbDefault={dividerRb(input.compensator.r1, input.feedback.vref, input.converter.vout)}
              readOnly={readOnly}
              onChange={onAmplifierChange}
            />
          </div>
          {!readOnly && (
            <details className="mt-4 rounded-md border border-slate-200 p-3" open={saved.revision === null}>
              <summary className="cursor-pointer text-sm font-semibold text-slate-800">Starting point</summary>
              <div className="mt-3">
                <StartingPointForm
                  defaultCrossoverHz={targetFcHz}
                  defaultPhaseMarginDeg={startPm.current ?? 60}
                  type={input.compensator.type}
                  onPropose={propose}
                  onPhaseMarginTarget={onPmTarget}
                />
              </div>
            </details>
          )}
        </Card>
        <Card title="Parts">
          {parts ? (
            <PartsTable
              parts={parts}
              type={input.compensator.type}
              topology={input.converter.topology}
              amplifier={input.compensator.amplifier}
              readOnly={readOnly}
              lock={lock?.part ?? 'r1'}
              onSeriesChange={onSeriesChange}
              onPartChange={onPartChange}
              onLockChange={onLockChange}
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
