/**
 * Plotly for the browser, loaded once and shared. In production it is the copy of
 * plotly.js-dist-min's bundle the build places at PLOTLY_SCRIPT_PATH (a page with a plot
 * preloads that file, so by now it is usually in the cache and only has to be evaluated); the
 * dev server has no such copy and imports the package instead.
 */
import createPlotlyComponent from 'react-plotly.js/factory';
import { PLOTLY_SCRIPT_PATH } from '@/lib/plotly-asset';

export type PlotlyModule = typeof import('plotly.js-dist-min');
export type PlotComponent = ReturnType<typeof createPlotlyComponent>;

declare global {
  interface Window {
    Plotly?: PlotlyModule;
  }
}

function fromScript(): Promise<PlotlyModule> {
  return new Promise((resolve, reject) => {
    if (window.Plotly) return resolve(window.Plotly);
    const script = document.createElement('script');
    script.src = PLOTLY_SCRIPT_PATH;
    script.async = true;
    script.onload = () => (window.Plotly ? resolve(window.Plotly) : reject(new Error(`${PLOTLY_SCRIPT_PATH} did not define Plotly`)));
    script.onerror = () => reject(new Error(`${PLOTLY_SCRIPT_PATH} could not be loaded`));
    document.head.appendChild(script);
  });
}

let plotlyPromise: Promise<PlotlyModule> | null = null;
/** Fetch (if not yet cached) and evaluate Plotly, once; later calls share the promise. */
export const loadPlotly = (): Promise<PlotlyModule> =>
  (plotlyPromise ??=
    process.env.NODE_ENV === 'production' ? fromScript() : import('plotly.js-dist-min').then((m) => ('default' in m && m.default ? m.default : m) as PlotlyModule));

let componentPromise: Promise<PlotComponent> | null = null;
/** react-plotly.js's Plot component bound to the loaded Plotly (its factory), made once. */
export const loadPlotComponent = (): Promise<PlotComponent> => (componentPromise ??= loadPlotly().then((P) => createPlotlyComponent(P)));
