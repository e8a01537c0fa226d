import { preload } from 'react-dom';
import { PLOTLY_SCRIPT_PATH } from '@/lib/plotly-asset';

/**
 * Called by a page (server component) that shows a Plotly plot: emits
 * `<link rel="preload" as="script">` for Plotly's bundle, so the browser fetches it while the
 * page's own scripts load and hydrate. Fetching is not evaluating: the plot evaluates it when it
 * mounts (Tune: after its SVG first picture). Low priority, so it never delays the page's own
 * files. Production only (the dev server imports the package instead).
 */
export function preloadPlotly() {
  if (process.env.NODE_ENV === 'production') preload(PLOTLY_SCRIPT_PATH, { as: 'script', fetchPriority: 'low' });
}
