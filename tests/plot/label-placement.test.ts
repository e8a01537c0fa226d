import { describe, expect, it } from 'vitest';
import { buildBodeLabels, computeRanges, type BodeContent } from '@/components/plot/bode-traces';
import { computeGeometry, plotMargin } from '@/components/plot/geometry';
import { estimateLabelWidth, placeLabels, type Box, type LabelRequest } from '@/components/plot/label-placement';

const bounds: Box = { x0: 0, y0: 0, x1: 800, y1: 300 };
const label = (id: string, text: string, x: number, y: number, prefer: LabelRequest['prefer'] = 'below-right'): LabelRequest => ({ id, text, x, y, prefer, bounds });

/** The label boxes in px, as placed. */
function boxesOf(requests: LabelRequest[], placed: ReturnType<typeof placeLabels>): Box[] {
  return placed.map((p, i) => ({
    x0: requests[i].x + p.dx - p.width / 2,
    y0: requests[i].y + p.dy - p.height / 2,
    x1: requests[i].x + p.dx + p.width / 2,
    y1: requests[i].y + p.dy + p.height / 2,
  }));
}
const overlap = (a: Box, b: Box) => a.x0 < b.x1 && b.x0 < a.x1 && a.y0 < b.y1 && b.y0 < a.y1;
const inside = (a: Box, b: Box) => a.x0 >= b.x0 && a.x1 <= b.x1 && a.y0 >= b.y0 && a.y1 <= b.y1;

function expectNoOverlap(boxes: Box[]) {
  for (let i = 0; i < boxes.length; i++) for (let j = i + 1; j < boxes.length; j++) expect(overlap(boxes[i], boxes[j]), `labels ${i} and ${j}`).toBe(false);
}

describe('plot label placement', () => {
  it('keeps a lone label on its preferred side, next to its anchor, without a leader', () => {
    const [p] = placeLabels([label('fc', 'fc 49.2 kHz', 400, 150, 'below-right')]);
    expect(p.dx).toBeGreaterThan(0);
    expect(p.dy).toBeGreaterThan(0);
    expect(p.leader).toBe(false);
    expect(p.overlaps).toBe(false);
  });

  it('separates labels whose anchors (nearly) coincide: fc next to the RHP zero, GM and PM', () => {
    const requests = [
      label('fc', 'fc 49.2 kHz', 400, 150, 'below-right'),
      label('rhp', 'RHP zero', 404, 152, 'above'),
      label('gm', 'GM 4.8 dB', 410, 160, 'below-left'),
      label('lc', 'LC resonance', 396, 148, 'above'),
      label('esr', 'ESR zero', 402, 150, 'above'),
      label('pm', 'PM 43.4°', 400, 150, 'above-right'),
    ];
    const placed = placeLabels(requests);
    expect(placed.every((p) => !p.overlaps)).toBe(true);
    const boxes = boxesOf(requests, placed);
    expectNoOverlap(boxes);
    for (const b of boxes) expect(inside(b, bounds)).toBe(true);
    // Those pushed away from a crowded anchor are joined to it by a leader line.
    expect(placed.some((p) => p.leader)).toBe(true);
  });

  it('stays inside its panel near an edge', () => {
    const requests = [label('a', 'fc 190 kHz', 795, 295, 'below-right'), label('b', 'GM 12.0 dB', 790, 5, 'above-right')];
    for (const b of boxesOf(requests, placeLabels(requests))) expect(inside(b, bounds)).toBe(true);
  });

  it('moves off a marker or handle box, and off a curve when a free spot is near', () => {
    const handle: Box = { x0: 405, y0: 140, x1: 470, y1: 175 };
    const requests = [label('fc', 'fc 12 kHz', 400, 150, 'below-right')];
    const [box] = boxesOf(requests, placeLabels(requests, { boxes: [handle] }));
    expect(overlap(box, handle)).toBe(false);

    const curve = Array.from({ length: 200 }, (_, i) => ({ x: 300 + i, y: 160 + (i - 100) * 0.05 }));
    const [onCurve] = boxesOf(requests, placeLabels(requests, { points: curve }));
    expect(curve.filter((p) => p.x > onCurve.x0 && p.x < onCurve.x1 && p.y > onCurve.y0 && p.y < onCurve.y1)).toHaveLength(0);
  });

  it('estimates wider boxes for longer text', () => {
    expect(estimateLabelWidth('LC resonance')).toBeGreaterThan(estimateLabelWidth('RHP zero'));
    expect(estimateLabelWidth('fc 49.2 kHz')).toBeGreaterThan(50);
  });
});

describe('Bode plot labels', () => {
  const f = Array.from({ length: 200 }, (_, i) => 10 ** (1 + (i / 199) * 5));
  const loop = { id: 'loop', name: 'T', color: '#4f46e5', magDb: f.map((x) => 60 - 20 * Math.log10(x / 10)), phaseDeg: f.map(() => -120) };
  const geometryOf = (c: BodeContent, width = 900) => computeGeometry(width, 480, computeRanges(c), plotMargin(false));

  it('labels two close crossovers (Compare) and the RHP zero without overlap, each on its own side', () => {
    const content: BodeContent = {
      f,
      series: [loop],
      markers: [{ id: 'rhp', hz: 52e3, magDb: -8, kind: 'zero', label: 'RHP zero', color: '#dc2626' }],
      margins: [
        { crossoverHz: 47e3, phaseMarginDeg: 43.4, phaseCrossoverHz: 120e3, gainMarginDb: 4.8, label: 'r1', color: '#64748b' },
        { crossoverHz: 49.2e3, phaseMarginDeg: 45.1, phaseCrossoverHz: 125e3, gainMarginDb: 5.2, label: 'r2', color: '#4f46e5' },
      ],
    };
    const g = geometryOf(content);
    const notes = buildBodeLabels(content, g);
    expect(notes.map((n) => n.text)).toEqual(['r1 fc 47 kHz', 'r2 fc 49.2 kHz', 'RHP zero', 'r1 PM 43.4°', 'r1 GM 4.8 dB', 'r2 PM 45.1°', 'r2 GM 5.2 dB']);
    const rhp = notes.find((n) => n.text === 'RHP zero')!;
    expect(rhp.font?.color).toBe('#dc2626');
    // Annotations on the log axis take log10(Hz).
    expect(rhp.x).toBeCloseTo(Math.log10(52e3), 9);

    const boxes = notes.map((n) => {
      const x = g.hzToX(10 ** (n.x as number)) + (n.ax as number);
      const y = (n.yref === 'y' ? g.dbToY(n.y as number) : g.degToY(n.y as number)) + (n.ay as number);
      const w = estimateLabelWidth(n.text!);
      return { x0: x - w / 2, x1: x + w / 2, y0: y - 7.5, y1: y + 7.5 };
    });
    expectNoOverlap(boxes);
    // The lower crossover's label leans left of its line, the higher one's right.
    expect(notes[0].ax as number).toBeLessThan(0);
    expect(notes[1].ax as number).toBeGreaterThan(0);
  });

  it('draws no labels before the plot has a width', () => {
    const content: BodeContent = { f, series: [loop], margins: [{ crossoverHz: 1e3, phaseMarginDeg: 50, phaseCrossoverHz: null, gainMarginDb: null }] };
    expect(buildBodeLabels(content, geometryOf(content, 0))).toEqual([]);
  });
});
