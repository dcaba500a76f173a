import { TestBed } from '@angular/core/testing';
import { BodePlot } from './bode-plot';
import { labelBox, overlaps, placeLabels, ringBox, textWidth, type Box, type LabelRequest } from './label-place';
import { curveStyle } from './palette';
import type { PlotMarker } from './plot-geometry';

const bounds: Box = { x: 0, y: 0, width: 500, height: 200 };

function boxesOf(placed: ReturnType<typeof placeLabels>['placed']): Box[] {
  return placed.map((p) => p.box);
}

function noOverlaps(boxes: readonly Box[]): boolean {
  return boxes.every((a, i) => boxes.every((b, j) => i === j || !overlaps(a, b)));
}

describe('label placement', () => {
  it('puts a lone label just above and right of its point', () => {
    const { placed, dropped } = placeLabels([{ id: 'a', text: '−3 dB at 2.20 MHz', x: 100, y: 100, priority: 0 }], bounds);
    expect(dropped).toEqual([]);
    expect(placed[0]).toMatchObject({ x: 108, y: 91, anchor: 'start' });
  });

  it('nudges the second of two labels at one point so that they do not overlap', () => {
    const requests: LabelRequest[] = [
      { id: 'corner', text: '−3 dB at 2.20 MHz', x: 200, y: 80, priority: 0 },
      { id: 'unity', text: '0 dB at 2.31 MHz', x: 204, y: 82, priority: 1 },
    ];
    const { placed, dropped } = placeLabels(requests, bounds, [ringBox(200, 80), ringBox(204, 82)]);
    expect(dropped).toEqual([]);
    expect(noOverlaps(boxesOf(placed))).toBe(true);
    // The more important label keeps its first spot; the other moved a row.
    expect(placed.find((p) => p.id === 'corner')!.y).toBe(71);
    expect(placed.find((p) => p.id === 'unity')!.y).not.toBe(73);
    for (const p of placed) expect(overlaps(p.box, ringBox(200, 80)) || overlaps(p.box, ringBox(204, 82))).toBe(false);
  });

  it('goes to the left of a point near the right edge, and keeps out of the cursor strip', () => {
    const strip: Box = { x: 0, y: 180, width: 500, height: 20 };
    const { placed } = placeLabels([{ id: 'a', text: '0 dB at 167 MHz', x: 480, y: 188, priority: 0 }], bounds, [strip]);
    expect(placed[0].anchor).toBe('end');
    expect(placed[0].box.x + placed[0].box.width).toBeLessThanOrEqual(472);
    expect(overlaps(placed[0].box, strip)).toBe(false);
    expect(placed[0].box.y + placed[0].box.height).toBeLessThanOrEqual(200);
  });

  it('drops the lesser label when there is no room, never the more important one', () => {
    // Room for one row of text beside the point, and nothing to its left.
    const tight: Box = { x: 0, y: 0, width: 140, height: 30 };
    const { placed, dropped } = placeLabels([
      { id: 'minor', text: '0 dB at 2.31 MHz', x: 10, y: 20, priority: 1 },
      { id: 'major', text: '−3 dB at 2.20 MHz', x: 10, y: 20, priority: 0 },
    ], tight);
    expect(placed.map((p) => p.id)).toEqual(['major']);
    expect(dropped).toEqual(['minor']);
  });

  it('estimates text wide enough for the digits and units the plots write', () => {
    // Source Sans 3 figures are about 0.5 em wide: the estimate errs a little wide (common practice).
    expect(textWidth('0000')).toBeGreaterThanOrEqual(4 * 0.5 * 12);
    expect(labelBox('abc', 50, 20, 'end').x + labelBox('abc', 50, 20, 'end').width).toBeCloseTo(50, 9);
    expect(labelBox('abc', 50, 20, 'middle').x).toBeCloseTo(50 - textWidth('abc') / 2, 9);
  });
});

describe('marker labels on a drawn plot', () => {
  const freqHz = Array.from({ length: 81 }, (_, k) => 10 * Math.pow(10, k / 10));
  // A single-pole roll-off from 20 dB at 1 MHz: the corner and the 0 dB crossing are a decade
  // apart; two more markers are crowded next to them.
  const db = freqHz.map((f) => 20 - 10 * Math.log10(1 + (f / 1e6) ** 2));
  const series = [{ key: 'a', label: 'a', db, phase_deg: db.map(() => 0), style: curveStyle(0) }];
  const at = (f: number, d: number, label: string, kind: PlotMarker['kind']): PlotMarker => ({ kind, freqHz: f, db: d, label, color: '' });

  it('keeps every label clear of the others, of the rings and of the cursor label; a dropped one stays as a tooltip', async () => {
    const fixture = TestBed.createComponent(BodePlot);
    fixture.componentRef.setInput('freqHz', freqHz);
    fixture.componentRef.setInput('series', series);
    fixture.componentRef.setInput('showPhase', false);
    fixture.componentRef.setInput('height', 220);
    fixture.componentRef.setInput('markers', [
      at(1e6, 17, '−3 dB at 1.00 MHz', 'corner'),
      at(1.05e6, 16.8, '−3 dB at 1.05 MHz', 'corner'),
      at(1.1e6, 16.6, '−3 dB at 1.10 MHz', 'corner'),
      at(1e7, 0, '0 dB at 10.0 MHz', 'unity'),
    ]);
    await fixture.whenStable();
    const el = fixture.nativeElement as HTMLElement;
    const plot = fixture.componentInstance;
    // Put the cursor at the 0 dB crossing, right under its marker.
    plot.moveCursorTo(1e7);
    await fixture.whenStable();
    const labels = [...el.querySelectorAll<SVGTextElement>('.marker-label')];
    const box = (t: SVGTextElement) => labelBox(t.textContent!, Number(t.getAttribute('x')), Number(t.getAttribute('y')), (t.getAttribute('text-anchor') ?? 'start') as 'start' | 'end');
    const boxes = labels.map(box);
    expect(labels.length + plot.droppedLabels.length).toBe(4);
    expect(noOverlaps(boxes)).toBe(true);
    const rings = [...el.querySelectorAll('.marker circle')].map((c) => ringBox(Number(c.getAttribute('cx')), Number(c.getAttribute('cy'))));
    for (const b of boxes) expect(rings.some((r) => overlaps(b, r))).toBe(false);
    const cursor = el.querySelector<SVGTextElement>('g.cursor .cursor-label')!;
    expect(cursor.textContent).toBe('10 MHz');
    const cursorBox = box(cursor);
    for (const b of boxes) expect(overlaps(b, cursorBox)).toBe(false);
    // Every marker names its value in a tooltip, drawn label or not.
    expect([...el.querySelectorAll('.marker title')].map((t) => t.textContent)).toContain('0 dB at 10.0 MHz');
    expect(el.querySelectorAll('.marker title').length).toBe(4);
  });
});
