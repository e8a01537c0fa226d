'use client';

/**
 * Thin Plotly wrapper. Plotly (plotly.js-dist-min, ~1.4 MB gzip) is imported
 * dynamically on first mount, so it never reaches the server bundle nor pages
 * without a plot. Updates go through Plotly.react, coalesced to one per
 * animation frame (a dragged handle can emit many updates per frame); the
 * container's ResizeObserver resizes the plot; unmount purges it.
 *
 * Props: `data`, `layout`, `config` as Plotly takes them; `onRendered` is
 * called after each draw with the graph div and its size (overlays read it);
 * `children` render above the plot in a relatively positioned box.
 */
import { useEffect, useRef, useState } from 'react';
import type { Config, Data, Layout } from 'plotly.js-dist-min';

type PlotlyModule = typeof import('plotly.js-dist-min');

let plotlyPromise: Promise<PlotlyModule> | null = null;
/** Start fetching and evaluating Plotly (once); later calls share the same promise. */
export const loadPlotly = () => (plotlyPromise ??= import('plotly.js-dist-min').then((m) => (m.default ?? m) as PlotlyModule));

export interface PlotlyChartProps {
  data: Data[];
  layout: Partial<Layout>;
  config?: Partial<Config>;
  className?: string;
  /** Called with the container size whenever it changes (before the plot is redrawn). */
  onSize?: (size: { width: number; height: number }) => void;
  /** False holds Plotly back (a caller drawing its own first picture); default true. */
  load?: boolean;
  /** Called once, after Plotly's first draw has finished. */
  onDrawn?: () => void;
  /** Show "Loading plot…" until Plotly is ready (default true). */
  placeholder?: boolean;
  children?: React.ReactNode;
  'data-testid'?: string;
  'aria-label'?: string;
}

const BASE_CONFIG: Partial<Config> = { displaylogo: false, responsive: false, displayModeBar: false, scrollZoom: false };

export function PlotlyChart({ data, layout, config, className, onSize, load = true, onDrawn, placeholder = true, children, ...rest }: PlotlyChartProps) {
  const boxRef = useRef<HTMLDivElement>(null);
  const plotRef = useRef<HTMLDivElement>(null);
  const latest = useRef({ data, layout, config });
  const frame = useRef<number | null>(null);
  const [ready, setReady] = useState(false);
  const plotly = useRef<PlotlyModule | null>(null);
  const drawn = useRef(false);
  const onDrawnRef = useRef(onDrawn);
  onDrawnRef.current = onDrawn;
  latest.current = { data, layout, config };

  const draw = () => {
    if (frame.current !== null) return;
    frame.current = requestAnimationFrame(() => {
      frame.current = null;
      const el = plotRef.current;
      const P = plotly.current;
      if (!el || !P) return;
      const { data: d, layout: l, config: c } = latest.current;
      void P.react(el, d, { ...l, width: el.clientWidth || undefined }, { ...BASE_CONFIG, ...c }).then(() => {
        if (drawn.current) return;
        drawn.current = true;
        onDrawnRef.current?.();
      });
    });
  };

  useEffect(() => {
    if (!load) return;
    let alive = true;
    loadPlotly().then((P) => {
      if (!alive) return;
      plotly.current = P;
      setReady(true);
      draw();
    });
    return () => {
      alive = false;
    };
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [load]);

  useEffect(() => {
    const el = plotRef.current;
    const box = boxRef.current;
    const ro = new ResizeObserver(() => {
      if (box) onSizeRef.current?.({ width: box.clientWidth, height: box.clientHeight });
      draw();
    });
    if (box) ro.observe(box);
    return () => {
      ro.disconnect();
      if (frame.current !== null) cancelAnimationFrame(frame.current);
      if (el && plotly.current) plotly.current.purge(el);
    };
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, []);

  const onSizeRef = useRef(onSize);
  onSizeRef.current = onSize;

  useEffect(() => {
    if (ready) draw();
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [data, layout, config, ready]);

  return (
    <div ref={boxRef} role="group" className={`relative ${className ?? ''}`} data-plot-ready={ready ? 'true' : 'false'} {...rest}>
      <div ref={plotRef} className="absolute inset-0" />
      {!ready && placeholder && <div className="absolute inset-0 grid place-items-center text-sm text-slate-400">Loading plot…</div>}
      {children}
    </div>
  );
}
