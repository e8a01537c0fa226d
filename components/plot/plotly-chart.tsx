'use client';

/**
 * A Plotly plot: react-plotly.js's component from its factory, bound to Plotly loaded on first
 * mount (plotly-loader.ts), so Plotly never reaches the server bundle nor a page without a plot.
 * The wrapper measures its box (layout width, `onSize` for overlays) before the first paint, so
 * a caller can draw its own first picture (children) at once and let Plotly take over.
 *
 * Props: `data`, `layout`, `config` as Plotly takes them; `load={false}` holds Plotly back;
 * `onDrawn` is called after Plotly's first draw; `children` render above the plot in a relatively
 * positioned box.
 */
import { useCallback, useEffect, useLayoutEffect, useMemo, useRef, useState } from 'react';
import type { Config, Data, Layout } from 'plotly.js-dist-min';
import { loadPlotComponent, type PlotComponent } from './plotly-loader';

export interface PlotlyChartProps {
  data: Data[];
  layout: Partial<Layout>;
  config?: Partial<Config>;
  className?: string;
  /** Called with the box's size on mount (before the first paint) and whenever it changes. */
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
const FILL: React.CSSProperties = { position: 'absolute', inset: 0 };

export function PlotlyChart({ data, layout, config, className, onSize, load = true, onDrawn, placeholder = true, children, ...rest }: PlotlyChartProps) {
  const boxRef = useRef<HTMLDivElement>(null);
  const [Plot, setPlot] = useState<PlotComponent | null>(null);
  const [width, setWidth] = useState(0);
  const onSizeRef = useRef(onSize);
  onSizeRef.current = onSize;
  const onDrawnRef = useRef(onDrawn);
  onDrawnRef.current = onDrawn;

  // Measured in a layout effect so the caller's first picture is in the first paint after hydration.
  useLayoutEffect(() => {
    const box = boxRef.current;
    if (!box) return;
    const measure = () => {
      setWidth(box.clientWidth);
      onSizeRef.current?.({ width: box.clientWidth, height: box.clientHeight });
    };
    measure();
    const ro = new ResizeObserver(measure);
    ro.observe(box);
    return () => ro.disconnect();
  }, []);

  useEffect(() => {
    if (!load) return;
    let alive = true;
    void loadPlotComponent().then((C) => {
      if (alive) setPlot(() => C);
    });
    return () => {
      alive = false;
    };
  }, [load]);

  const fullLayout = useMemo(() => ({ ...layout, width: width || undefined }), [layout, width]);
  const fullConfig = useMemo(() => ({ ...BASE_CONFIG, ...config }), [config]);
  const drawn = useCallback(() => onDrawnRef.current?.(), []);

  return (
    <div ref={boxRef} role="group" className={`relative ${className ?? ''}`} data-plot-ready={Plot ? 'true' : 'false'} {...rest}>
      {Plot && width > 0 && <Plot data={data} layout={fullLayout} config={fullConfig} onInitialized={drawn} style={FILL} />}
      {!Plot && placeholder && <div className="absolute inset-0 grid place-items-center text-sm text-slate-400">Loading plot…</div>}
      {children}
    </div>
  );
}
