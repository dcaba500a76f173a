import { afterNextRender, computed, DestroyRef, inject, signal, untracked, type Signal } from '@angular/core';

/**
 * Sizing a plot from its container: a plot takes the height its panel leaves free, so that on a
 * tall screen it fills the panel instead of sitting in half of it, and on a short one it keeps a
 * readable minimum and the panel scrolls. The panel is the nearest scrolling ancestor (the
 * results' tab body); the free height is what that ancestor shows beyond its content, so a plot
 * grown by exactly that much fills it, and a second measure then finds nothing left to take.
 */

/** The nearest ancestor that scrolls vertically; undefined when none does (or no layout runs). */
export function scrollParent(el: Element): HTMLElement | undefined {
  const view = el.ownerDocument.defaultView;
  if (!view) return undefined;
  for (let p = el.parentElement; p; p = p.parentElement) {
    const overflow = view.getComputedStyle(p).overflowY;
    if (overflow === 'auto' || overflow === 'scroll') return p;
  }
  return undefined;
}

/**
 * Height (px) that `scroller` shows beyond the bottom of its content; negative when the content
 * overflows it. Undefined while it is not laid out (a hidden tab, or no layout engine).
 */
export function freeHeight(scroller: HTMLElement): number | undefined {
  if (scroller.clientHeight <= 0) return undefined;
  const top = scroller.getBoundingClientRect().top + scroller.clientTop;
  let bottom = -Infinity;
  for (const child of Array.from(scroller.children)) {
    const r = child.getBoundingClientRect();
    if (r.width === 0 && r.height === 0) continue;
    const margin = parseFloat(scroller.ownerDocument.defaultView?.getComputedStyle(child).marginBottom ?? '') || 0;
    bottom = Math.max(bottom, r.bottom + margin);
  }
  if (!Number.isFinite(bottom)) return undefined;
  const padding = parseFloat(scroller.ownerDocument.defaultView?.getComputedStyle(scroller).paddingBottom ?? '') || 0;
  // Content coordinates: a scrolled panel has moved its content up by scrollTop.
  const contentHeight = bottom + scroller.scrollTop - top + padding;
  return Math.floor(scroller.clientHeight - contentHeight);
}

/** The height a plot now `current` px tall should take, within [min, max]. */
export function fittedHeight(current: number, free: number, min: number, max: number): number {
  return Math.round(Math.min(max, Math.max(min, current + free)));
}

/**
 * Watches `host`, its scrolling panel and the panel's content (which grows when a legend wraps)
 * and calls `measure` with the panel's free height whenever one of them changes size. Call it
 * once the host is in the page. Everything is observed at once: an ancestor first observed from
 * inside the observer's own callback would be reported at a shallower depth in the same frame,
 * which the browser flags as a ResizeObserver loop. Returns the function that stops watching.
 * Without ResizeObserver (tests in jsdom) or a scrolling panel it does nothing.
 */
export function watchFreeHeight(host: HTMLElement, measure: (free: number) => void): () => void {
  const scroller = scrollParent(host);
  if (typeof ResizeObserver !== 'function' || !scroller) return () => undefined;
  const observer = new ResizeObserver(() => {
    const free = freeHeight(scroller);
    if (free !== undefined) measure(free);
  });
  for (const el of new Set([host, scroller, ...Array.from(scroller.children)])) observer.observe(el);
  return () => observer.disconnect();
}

/** How a plot is sized: a fixed height, or filling its panel between `least` and `max`. */
export interface PlotSizing {
  /** A fixed height in pixels, when the page asked for one. */
  fixed: () => number | undefined;
  /** The least height when filling. */
  least: () => number;
  /** The height before the first measure (and where no layout runs, as in tests). */
  initial: () => number;
  /** Past this a taller plot shows nothing more. */
  max: number;
}

/**
 * A plot's size from its container: the width of its host element and the height its panel
 * leaves free (see watchFreeHeight). Create it in an injection context (a component's field);
 * it stops watching when the component goes.
 */
export class PlotSize {
  /** Width of the host in CSS pixels. */
  readonly width = signal(640);
  /** The height to draw at. */
  readonly height: Signal<number>;
  private readonly fitted = signal<number | undefined>(undefined);

  constructor(host: HTMLElement, sizing: PlotSizing) {
    this.height = computed(() => sizing.fixed() ?? Math.max(sizing.least(), this.fitted() ?? sizing.initial()));
    const observer = typeof ResizeObserver === 'function'
      ? new ResizeObserver((entries) => {
        const w = Math.floor(entries[0]?.contentRect.width ?? 0);
        if (w > 0 && w !== this.width()) this.width.set(w);
      })
      : undefined;
    observer?.observe(host);
    let stopFitting = () => undefined as void;
    afterNextRender(() => {
      stopFitting = watchFreeHeight(host, (free) => {
        if (untracked(sizing.fixed) !== undefined) return;
        const current = untracked(this.height);
        const next = fittedHeight(current, free, untracked(sizing.least), sizing.max);
        if (next !== current) this.fitted.set(next);
      });
    });
    inject(DestroyRef).onDestroy(() => {
      observer?.disconnect();
      stopFitting();
    });
  }
}
