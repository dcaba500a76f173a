/**
 * Placing the labels of a plot's markers so that none overlaps another, a marker's ring or the
 * cursor's own label: each label tries the spots near its point in order of closeness (beside
 * the point, then nudged up and down a row at a time, then the other side), and a label that
 * finds no free spot inside the plot is dropped; its marker still carries the text as a
 * tooltip. Pure geometry on estimated text widths, so the page and the exported file agree and
 * it is tested without a browser.
 */

/** An axis-aligned box in SVG coordinates. */
export interface Box {
  x: number;
  y: number;
  width: number;
  height: number;
}

/** Where a label may sit relative to its point: an offset and the text anchor there. */
export interface LabelSpot {
  dx: number;
  anchor: 'start' | 'middle' | 'end';
}

export interface LabelRequest {
  id: string;
  text: string;
  /** The point the label names. */
  x: number;
  y: number;
  /** Lower numbers are placed first, so a lesser label is the one dropped. */
  priority: number;
  /** Spots to try, best first; by default right of the point, then left. */
  spots?: readonly LabelSpot[];
  /** Baseline offset from the point of the first row tried (default −9: just above it). */
  dy?: number;
}

export interface PlacedLabel {
  id: string;
  text: string;
  /** Text position: `x` with `anchor`, `y` the baseline. */
  x: number;
  y: number;
  anchor: LabelSpot['anchor'];
  box: Box;
}

export interface Placement {
  placed: PlacedLabel[];
  /** Ids of the labels that found no room, lesser ones first to go. */
  dropped: string[];
}

export const LABEL_FONT_PX = 12;
/** A row of text with a little air: the step of a vertical nudge. */
const ROW = LABEL_FONT_PX + 4;
/** How many rows a label may be nudged up or down from its first spot. */
const MAX_NUDGE = 6;
const PAD = 2;

const SIDE_SPOTS: readonly LabelSpot[] = [{ dx: 8, anchor: 'start' }, { dx: -8, anchor: 'end' }];

/**
 * Width of `text` in the plot font at 12 px, semi-bold. An estimate from character classes
 * (digits and most letters ≈ 0.55 em, narrow letters and punctuation less, wide ones more),
 * erring wide so that estimated boxes hold the drawn text.
 */
export function textWidth(text: string, fontPx = LABEL_FONT_PX): number {
  let em = 0;
  for (const ch of text) {
    if (ch === ' ') em += 0.26;
    else if ('.,:;!|iIjlft()[]\'’'.includes(ch)) em += 0.32;
    else if ('mwMW%'.includes(ch)) em += 0.86;
    else if (/[A-Z−±≥≤µΩ—…]/u.test(ch)) em += 0.64;
    else em += 0.56;
  }
  return em * fontPx;
}

/** The box a label takes with its text at (x, baseline) and the given anchor. */
export function labelBox(text: string, x: number, baseline: number, anchor: LabelSpot['anchor']): Box {
  const width = textWidth(text);
  const left = anchor === 'start' ? x : anchor === 'end' ? x - width : x - width / 2;
  return { x: left, y: baseline - LABEL_FONT_PX * 0.82, width, height: LABEL_FONT_PX * 1.1 };
}

/** Whether two boxes overlap (touching edges do not count), with `pad` of air around each. */
export function overlaps(a: Box, b: Box, pad = 0): boolean {
  return a.x < b.x + b.width + pad && b.x < a.x + a.width + pad && a.y < b.y + b.height + pad && b.y < a.y + a.height + pad;
}

function inside(box: Box, bounds: Box): boolean {
  return box.x >= bounds.x && box.y >= bounds.y && box.x + box.width <= bounds.x + bounds.width && box.y + box.height <= bounds.y + bounds.height;
}

/** Row offsets in order of closeness: 0, −1, +1, −2, +2 … (up first: labels sit above points). */
function nudges(): number[] {
  const out = [0];
  for (let k = 1; k <= MAX_NUDGE; k++) out.push(-k, k);
  return out;
}

/**
 * Places `requests` inside `bounds`, clear of `obstacles` (marker rings, the cursor's label
 * strip) and of one another. Labels are placed in priority order; for each, every nudge is
 * tried at the first spot, then at the next spot, so a label keeps to its preferred side
 * before it moves across its point.
 */
export function placeLabels(requests: readonly LabelRequest[], bounds: Box, obstacles: readonly Box[] = []): Placement {
  const order = [...requests].sort((a, b) => a.priority - b.priority);
  const taken: Box[] = [...obstacles];
  const placed: PlacedLabel[] = [];
  const dropped: string[] = [];
  for (const r of order) {
    const spots = r.spots ?? SIDE_SPOTS;
    let found: PlacedLabel | undefined;
    for (const spot of spots) {
      for (const k of nudges()) {
        const baseline = r.y + (r.dy ?? -9) + k * ROW;
        const x = r.x + spot.dx;
        const box = labelBox(r.text, x, baseline, spot.anchor);
        if (!inside(box, bounds) || taken.some((t) => overlaps(box, t, PAD))) continue;
        found = { id: r.id, text: r.text, x, y: baseline, anchor: spot.anchor, box };
        break;
      }
      if (found) break;
    }
    if (found) {
      placed.push(found);
      taken.push(found.box);
    } else {
      dropped.push(r.id);
    }
  }
  return { placed, dropped };
}

/** The box of a marker's ring of radius `r` at (x, y). */
export function ringBox(x: number, y: number, r = 5): Box {
  return { x: x - r, y: y - r, width: 2 * r, height: 2 * r };
}
