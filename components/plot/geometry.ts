/**
 * Pixel geometry of the Bode plot, computed from the same margins, domains
 * and ranges given to Plotly (automargin off), so overlays line up with the
 * drawn curves without reading Plotly internals.
 */

export interface PlotMargin {
  l: number;
  r: number;
  t: number;
  b: number;
}

/** Plot margins, px; the top one leaves room for Plotly's legend when it is shown. */
export const plotMargin = (showLegend: boolean): PlotMargin => ({ l: 72, r: 20, t: showLegend ? 34 : 14, b: 44 });
export const MAG_DOMAIN: [number, number] = [0.46, 1];
export const PHASE_DOMAIN: [number, number] = [0, 0.38];

export interface Ranges {
  /** log10(Hz) at the left and right edges. */
  x: [number, number];
  mag: [number, number];
  phase: [number, number];
}

export interface PlotGeometry {
  width: number;
  height: number;
  ranges: Ranges;
  /** Plot-area edges, px from the top-left of the plot box. */
  left: number;
  right: number;
  magTop: number;
  magBottom: number;
  phaseTop: number;
  phaseBottom: number;
  hzToX: (hz: number) => number;
  xToHz: (x: number) => number;
  dbToY: (db: number) => number;
  yToDb: (y: number) => number;
  degToY: (deg: number) => number;
}

export function computeGeometry(width: number, height: number, ranges: Ranges, margin: PlotMargin): PlotGeometry {
  const { l, r, t, b } = margin;
  const left = l;
  const right = Math.max(l + 1, width - r);
  const h = height - t - b;
  const yOf = (domain: [number, number]) => [t + (1 - domain[1]) * h, t + (1 - domain[0]) * h] as const;
  const [magTop, magBottom] = yOf(MAG_DOMAIN);
  const [phaseTop, phaseBottom] = yOf(PHASE_DOMAIN);
  const [x0, x1] = ranges.x;
  const [m0, m1] = ranges.mag;
  const [p0, p1] = ranges.phase;
  return {
    width,
    height,
    ranges,
    left,
    right,
    magTop,
    magBottom,
    phaseTop,
    phaseBottom,
    hzToX: (hz) => left + ((Math.log10(hz) - x0) / (x1 - x0)) * (right - left),
    xToHz: (x) => 10 ** (x0 + ((x - left) / (right - left)) * (x1 - x0)),
    dbToY: (db) => magBottom - ((db - m0) / (m1 - m0)) * (magBottom - magTop),
    yToDb: (y) => m0 + ((magBottom - y) / (magBottom - magTop)) * (m1 - m0),
    degToY: (deg) => phaseBottom - ((deg - p0) / (p1 - p0)) * (phaseBottom - phaseTop),
  };
}
