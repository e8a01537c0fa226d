'use client';

import { useMemo } from 'react';
import type { Shape } from 'plotly.js-dist-min';
import { PlotlyChart } from '@/components/plot/plotly-chart';
import type { Histogram as HistogramData, Percentiles } from '@/lib/engine/spread';

/** One quantity of the spread as a bar histogram, with its 1st/50th/99th percentiles and the target drawn. */
export function Histogram({
  title,
  unit,
  data,
  percentiles,
  target,
  scale = 1,
  testId,
}: {
  title: string;
  unit: string;
  data: HistogramData;
  percentiles: Percentiles | null;
  /** A margin target (a vertical red line). */
  target?: number;
  /** Display scale (e.g. 1e-3 to show kHz). */
  scale?: number;
  testId: string;
}) {
  const plot = useMemo(() => {
    const mids = data.counts.map((_, i) => ((data.edges[i] + data.edges[i + 1]) / 2) * scale);
    const width = (data.edges[1] - data.edges[0]) * scale;
    const shapes: Partial<Shape>[] = [];
    const line = (x: number, color: string, dash: 'dot' | 'solid') =>
      shapes.push({ type: 'line', xref: 'x', yref: 'paper', x0: x, x1: x, y0: 0, y1: 1, line: { color, width: 1.5, dash } });
    if (percentiles) for (const p of [percentiles.p1, percentiles.p50, percentiles.p99]) line(p * scale, '#475569', 'dot');
    if (target !== undefined) line(target * scale, '#dc2626', 'solid');
    return {
      data: [{ type: 'bar' as const, x: mids, y: data.counts, width, marker: { color: '#6366f1' }, hovertemplate: `%{x:.3g} ${unit}: %{y} samples<extra></extra>` }],
      layout: {
        height: 150,
        margin: { l: 40, r: 8, t: 22, b: 28 },
        title: { text: title, font: { size: 12 }, x: 0, xanchor: 'left' as const },
        xaxis: { title: { text: unit, font: { size: 10 } }, tickfont: { size: 10 } },
        yaxis: { tickfont: { size: 10 } },
        bargap: 0.05,
        shapes,
        paper_bgcolor: 'rgba(0,0,0,0)',
        plot_bgcolor: 'rgba(0,0,0,0)',
      },
    };
  }, [data, percentiles, target, scale, unit, title]);
  // The chart's box takes the plot's height: PlotlyChart draws into an absolutely placed layer,
  // so a box without a height is 0 px tall (hidden to assistive tools and tests, overlapped by
  // what follows).
  return <PlotlyChart className="h-[150px]" data={plot.data} layout={plot.layout} data-testid={testId} aria-label={`Histogram of ${title}`} />;
}
