/**
 * Where the Bode plot's text labels go (fc, PM, GM, LC resonance, ESR zero,
 * RHP zero, …) so that none covers another, a marker or a handle, and as
 * few as possible sit on a curve. Pure: pixels in, pixel offsets out.
 *
 * Each label has an anchor point (the thing it names) and a preferred side.
 * Labels are placed one after the other, most important first; each takes the
 * cheapest of a fixed list of spots around its anchor: the preferred one, the
 * other corners, then the same side stepped further away. A label moved well
 * away from its anchor gets a thin leader line back to it.
 */

export interface Box {
  x0: number;
  y0: number;
  x1: number;
  y1: number;
}

export type LabelSide = 'above' | 'below' | 'above-right' | 'below-right' | 'above-left' | 'below-left';

export interface LabelRequest {
  id: string;
  text: string;
  /** Anchor, px from the plot box's top-left. */
  x: number;
  y: number;
  prefer: LabelSide;
  /** The area the label must stay inside (its panel). */
  bounds: Box;
  /** Font size, px (default 11). */
  fontSize?: number;
}

export interface PlacedLabel {
  id: string;
  /** Offset of the label's centre from its anchor, px. */
  dx: number;
  dy: number;
  width: number;
  height: number;
  /** True when the label had to move far enough from its anchor to need a leader line. */
  leader: boolean;
  /** True when no spot was free of other labels (should not happen on a plot of ordinary size). */
  overlaps: boolean;
}

export interface Avoid {
  /** Things a label must not cover: markers, handles, margin bars. */
  boxes?: Box[];
  /** Curve samples: a label may cover some, but fewer is better. */
  points?: { x: number; y: number }[];
}

const GAP = 4;
const LEADER_PX = 22;

/** Width of a label in px: a generous per-character estimate of the UI font, plus the background padding. */
export function estimateLabelWidth(text: string, fontSize = 11): number {
  let w = 0;
  for (const ch of text) w += ch === ' ' ? 0.3 : ch === '.' || ch === '°' ? 0.35 : /[A-Z]/.test(ch) ? 0.68 : 0.58;
  return Math.ceil(w * fontSize) + 6;
}

/** A square box of half-size `half` around a point. */
export const around = (x: number, y: number, half: number): Box => ({ x0: x - half, y0: y - half, x1: x + half, y1: y + half });

/** Space kept between two labels, px. */
const SPACING = 3;

const overlap = (a: Box, b: Box) => a.x0 < b.x1 && b.x0 < a.x1 && a.y0 < b.y1 && b.y0 < a.y1;
const inside = (a: Box, b: Box) => a.x0 >= b.x0 && a.x1 <= b.x1 && a.y0 >= b.y0 && a.y1 <= b.y1;

/** Candidate centre offsets around the anchor, preferred first. */
function candidates(prefer: LabelSide, w: number, h: number): { dx: number; dy: number; cost: number }[] {
  const sx = w / 2 + GAP + 2;
  const sy = h / 2 + GAP;
  const spot: Record<LabelSide, [number, number]> = {
    'below-right': [sx, sy],
    'above-right': [sx, -sy],
    'below-left': [-sx, sy],
    'above-left': [-sx, -sy],
    above: [0, -(sy + 5)],
    below: [0, sy + 5],
  };
  const order: LabelSide[] = [prefer, ...(Object.keys(spot) as LabelSide[]).filter((s) => s !== prefer)];
  const out = order.map((s, i) => ({ dx: spot[s][0], dy: spot[s][1], cost: i * 2 }));
  // Stagger: the same spots stepped one, two, … label heights further from the anchor.
  for (let k = 1; k <= 5; k++) {
    order.forEach((s, i) => {
      const [dx, dy] = spot[s];
      out.push({ dx, dy: dy + Math.sign(dy) * k * (h + 2), cost: k * 12 + i * 2 });
    });
  }
  return out;
}

/**
 * Places labels in the order given (most important first). Cost of a spot:
 * covering a placed label or leaving the bounds is near-forbidden, covering a
 * marker box is bad, covering curve samples is mildly bad, and each step away
 * from the preferred spot costs a little, so labels stay close to what they name.
 */
export function placeLabels(labels: LabelRequest[], avoid: Avoid = {}): PlacedLabel[] {
  const placed: Box[] = [];
  const boxes = avoid.boxes ?? [];
  const points = avoid.points ?? [];
  return labels.map((l) => {
    const fs = l.fontSize ?? 11;
    const w = estimateLabelWidth(l.text, fs);
    const h = Math.ceil(fs * 1.35);
    let best: { dx: number; dy: number; cost: number; clash: boolean } | null = null;
    for (const { dx, dy, cost: distance } of candidates(l.prefer, w, h)) {
      const cx = l.x + dx;
      const cy = l.y + dy;
      const box = { x0: cx - w / 2, y0: cy - h / 2, x1: cx + w / 2, y1: cy + h / 2 };
      const clash = placed.some((p) => overlap({ x0: box.x0 - SPACING, y0: box.y0 - SPACING, x1: box.x1 + SPACING, y1: box.y1 + SPACING }, p));
      let cost = distance + (clash ? 10_000 : 0) + (inside(box, l.bounds) ? 0 : 5_000);
      for (const b of boxes) if (overlap(box, b)) cost += 400;
      let covered = 0;
      for (const p of points) if (p.x > box.x0 && p.x < box.x1 && p.y > box.y0 && p.y < box.y1) covered++;
      cost += Math.min(covered, 10) * 4;
      if (!best || cost < best.cost) best = { dx, dy, cost, clash };
    }
    const { dx, dy, clash } = best!;
    placed.push({ x0: l.x + dx - w / 2, y0: l.y + dy - h / 2, x1: l.x + dx + w / 2, y1: l.y + dy + h / 2 });
    return { id: l.id, dx, dy, width: w, height: h, leader: Math.abs(dy) > h / 2 + LEADER_PX || Math.abs(dx) > w / 2 + LEADER_PX, overlaps: clash };
  });
}

