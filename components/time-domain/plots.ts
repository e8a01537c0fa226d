import type { Data, Layout } from 'plotly.js-dist-min';

/** Shared look of the closed-loop and time plots (palette of the glossary: loop indigo, stage teal). */
export const COLORS = { closed: '#4f46e5', open: '#0d9488', reference: '#d97706', switching: '#64748b', band: 'rgba(100,116,139,0.25)', risk: '#dc2626' } as const;

export const freqLayout = (yTitle: string, height = 300): Partial<Layout> => ({
  height,
  margin: { l: 60, r: 16, t: 12, b: 44 },
  xaxis: { type: 'log', title: { text: 'Frequency (Hz)' }, exponentformat: 'SI', gridcolor: '#e2e8f0' },
  yaxis: { title: { text: yTitle }, gridcolor: '#e2e8f0', zerolinecolor: '#94a3b8' },
  legend: { orientation: 'h', y: -0.25 },
  showlegend: true,
  paper_bgcolor: 'white',
  plot_bgcolor: 'white',
  font: { size: 11 },
});

export const line = (name: string, x: number[], y: number[], color: string, dash: 'solid' | 'dash' | 'dot' = 'solid', width = 2): Data => ({
  type: 'scatter',
  mode: 'lines',
  name,
  x,
  y,
  line: { color, dash, width },
  hovertemplate: `${name}: %{y:.4g}<extra></extra>`,
});

/** A time axis in the unit that fits the window (µs or ms). */
export const timeScale = (tEndS: number): { factor: number; unit: string } => (tEndS < 2e-3 ? { factor: 1e6, unit: 'µs' } : { factor: 1e3, unit: 'ms' });
