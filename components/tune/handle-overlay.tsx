'use client';

import { useRef, useState } from 'react';
import { formatSi } from '@/lib/units/si';
import type { PlotGeometry } from '@/components/plot/bode-plot';
import type { DragScale, HandleMove, HandleSpec } from './handles';

export type { HandleMove } from './handles';

/** A pointer drag so far: the offset from where it started, px, and the plot's scale. */
export interface DragOffset {
  dxPx: number;
  dyPx: number;
  scale: DragScale;
}

export interface PlacedHandle extends HandleSpec {
  /** Where the handle sits on the magnitude panel, dB. */
  magDb: number;
}

interface Props {
  geometry: PlotGeometry;
  handles: PlacedHandle[];
  color: string;
  disabled: boolean;
  onDragStart: (id: string) => void;
  onDrag: (id: string, offset: DragOffset) => void;
  onDragEnd: (id: string) => void;
  /** One keyboard step, applied at once. */
  onStep: (id: string, move: HandleMove) => void;
}

export const HANDLE_SIZE = 24;
const SIZE = HANDLE_SIZE;
/** Keyboard steps: 1/48 decade (Shift: 1/8), 0.5 dB (Shift: 3 dB). */
const STEP_DECADE = 1 / 48;
const STEP_DECADE_BIG = 1 / 8;
const STEP_DB = 0.5;
const STEP_DB_BIG = 3;

function Glyph({ kind, color }: { kind: HandleSpec['kind']; color: string }) {
  if (kind === 'zero') return <circle cx={12} cy={12} r={6.5} fill="white" stroke={color} strokeWidth={2.5} />;
  if (kind === 'pole')
    return (
      <g stroke={color} strokeWidth={2.75} strokeLinecap="round">
        <line x1={6.5} y1={6.5} x2={17.5} y2={17.5} />
        <line x1={17.5} y1={6.5} x2={6.5} y2={17.5} />
      </g>
    );
  return (
    <g>
      <rect x={5} y={5} width={14} height={14} rx={2} transform="rotate(45 12 12)" fill={color} />
      <path d="M12 7.5 L14.5 10.5 H9.5 Z M12 16.5 L14.5 13.5 H9.5 Z" fill="white" />
    </g>
  );
}

/**
 * Pixel positions: on the curve, pinned to the plot edge when the frequency
 * lies outside the sweep, and stepped down when two handles would cover each other.
 */
export function placeHandles(handles: PlacedHandle[], g: PlotGeometry) {
  const out = new Map<string, { x: number; y: number; outside: 'left' | 'right' | null }>();
  const taken: { x: number; y: number }[] = [];
  for (const h of handles) {
    const raw = g.hzToX(h.hz);
    const outside = raw < g.left ? 'left' : raw > g.right ? 'right' : null;
    const x = Math.min(g.right, Math.max(g.left, Number.isFinite(raw) ? raw : g.left));
    let y = Math.min(g.magBottom, Math.max(g.magTop, g.dbToY(h.magDb)));
    while (taken.some((t) => Math.abs(t.x - x) < SIZE * 0.8 && Math.abs(t.y - y) < SIZE * 0.8)) y += SIZE * 0.85;
    taken.push({ x, y });
    out.set(h.id, { x, y, outside });
  }
  return out;
}

/**
 * Draggable compensator handles drawn above the Bode plot. Zeros and poles
 * move sideways (frequency); the gain handle moves up and down. Each handle
 * is a focusable slider: arrow keys step it (Shift for larger steps).
 */
export function HandleOverlay({ geometry: g, handles, color, disabled, onDragStart, onDrag, onDragEnd, onStep }: Props) {
  const boxRef = useRef<HTMLDivElement>(null);
  const drag = useRef<{ id: string; pointerId: number; startX: number; startY: number; handleX: number } | null>(null);
  const [active, setActive] = useState<string | null>(null);
  const fMin = 10 ** g.ranges.x[0];
  const fMax = 10 ** g.ranges.x[1];

  const local = (e: React.PointerEvent) => {
    const rect = boxRef.current!.getBoundingClientRect();
    return { x: e.clientX - rect.left, y: e.clientY - rect.top };
  };

  const onPointerDown = (h: PlacedHandle) => (e: React.PointerEvent<HTMLDivElement>) => {
    if (disabled || e.button !== 0) return;
    e.preventDefault();
    e.currentTarget.focus();
    e.currentTarget.setPointerCapture(e.pointerId);
    const p = local(e);
    drag.current = { id: h.id, pointerId: e.pointerId, startX: p.x, startY: p.y, handleX: g.hzToX(h.hz) };
    setActive(h.id);
    onDragStart(h.id);
  };

  const onPointerMove = (h: PlacedHandle) => (e: React.PointerEvent<HTMLDivElement>) => {
    const d = drag.current;
    if (!d || d.id !== h.id || d.pointerId !== e.pointerId) return;
    const p = local(e);
    // Relative to where the drag started (the ranges are held during a drag), so a drag back
    // by the same pixels returns exactly; a zero or pole stays inside the plot.
    const scale: DragScale = {
      pxPerDecade: (g.right - g.left) / (g.ranges.x[1] - g.ranges.x[0]),
      pxPerDb: Math.abs(g.dbToY(0) - g.dbToY(1)),
    };
    if (h.kind === 'gain') onDrag(h.id, { dxPx: 0, dyPx: p.y - d.startY, scale });
    else {
      const dx = Math.min(g.right - d.handleX, Math.max(g.left - d.handleX, p.x - d.startX));
      onDrag(h.id, { dxPx: dx, dyPx: 0, scale });
    }
  };

  const endDrag = (h: PlacedHandle) => (e: React.PointerEvent<HTMLDivElement>) => {
    const d = drag.current;
    if (!d || d.id !== h.id) return;
    drag.current = null;
    setActive(null);
    if (e.currentTarget.hasPointerCapture(e.pointerId)) e.currentTarget.releasePointerCapture(e.pointerId);
    onDragEnd(h.id);
  };

  const onKeyDown = (h: PlacedHandle) => (e: React.KeyboardEvent) => {
    if (disabled) return;
    const up = e.key === 'ArrowUp' || e.key === 'ArrowRight' || e.key === 'PageUp';
    const down = e.key === 'ArrowDown' || e.key === 'ArrowLeft' || e.key === 'PageDown';
    if (!up && !down) return;
    e.preventDefault();
    const big = e.shiftKey || e.key.startsWith('Page');
    const sign = up ? 1 : -1;
    if (h.kind === 'gain') onStep(h.id, { deltaDb: sign * (big ? STEP_DB_BIG : STEP_DB) });
    else onStep(h.id, { hz: h.hz * 10 ** (sign * (big ? STEP_DECADE_BIG : STEP_DECADE)) });
  };

  const positions = placeHandles(handles, g);

  return (
    <div ref={boxRef} className="pointer-events-none absolute inset-0" data-testid="handle-overlay">
      {handles.map((h) => {
        const { x, y, outside } = positions.get(h.id)!;
        const index = /\d$/.exec(h.label)?.[0];
        const value = h.kind === 'gain' ? (h.gainDb == null ? '—' : `${h.gainDb.toFixed(1).replace(/^-/, '−')} dB, sets the integrator`) : formatSi(h.hz, 'Hz');
        const isActive = active === h.id;
        return (
          <div
            key={h.id}
            role="slider"
            tabIndex={disabled ? -1 : 0}
            aria-label={`${h.label} handle (${h.parts})`}
            aria-valuetext={value}
            aria-valuenow={h.kind === 'gain' ? (h.gainDb ?? 0) : h.hz}
            aria-valuemin={h.kind === 'gain' ? -100 : fMin}
            aria-valuemax={h.kind === 'gain' ? 100 : fMax}
            aria-orientation={h.kind === 'gain' ? 'vertical' : 'horizontal'}
            aria-disabled={disabled || undefined}
            data-handle={h.id}
            className={`group pointer-events-auto absolute rounded-full outline-none focus-visible:ring-2 focus-visible:ring-indigo-500 ${
              disabled ? 'cursor-default' : h.kind === 'gain' ? 'cursor-ns-resize' : 'cursor-ew-resize'
            }`}
            style={{ left: x - SIZE / 2, top: y - SIZE / 2, width: SIZE, height: SIZE, touchAction: 'none' }}
            onPointerDown={onPointerDown(h)}
            onPointerMove={onPointerMove(h)}
            onPointerUp={endDrag(h)}
            onPointerCancel={endDrag(h)}
            onKeyDown={onKeyDown(h)}
          >
            <svg width={SIZE} height={SIZE} viewBox="0 0 24 24" aria-hidden className={disabled ? 'opacity-70' : 'drop-shadow'}>
              <Glyph kind={h.kind} color={color} />
            </svg>
            {index && (
              // Pinned to the right edge, the index moves to the left so it does not crowd the › beside it.
              <span
                className={`pointer-events-none absolute -top-1.5 text-[10px] font-bold leading-none ${outside === 'right' ? '-left-1.5' : '-right-1.5'}`}
                style={{ color }}
                aria-hidden
              >
                {index}
              </span>
            )}
            {outside && (
              <span className="pointer-events-none absolute top-1/2 -translate-y-1/2 text-xs font-bold leading-none" style={{ color, [outside === 'right' ? 'left' : 'right']: SIZE }} aria-hidden>
                {outside === 'right' ? '›' : '‹'}
              </span>
            )}
            <span
              className={`pointer-events-none absolute left-1/2 top-full mt-0.5 -translate-x-1/2 whitespace-nowrap rounded bg-slate-800/90 px-1.5 py-0.5 text-[11px] text-white ${
                isActive ? 'block' : 'hidden group-hover:block group-focus-visible:block'
              }`}
            >
              {h.label} · {value}
            </span>
          </div>
        );
      })}
    </div>
  );
}
