/**
 * Exporting a plot: the SVG itself (styles inlined so it stands alone), a PNG rendered from that
 * SVG on a 2D canvas at twice the size (no GPU needed), and its curves as CSV.
 */

/** One exported curve: the numbers exactly as plotted. */
export interface CsvCurve {
  key: string;
  db: readonly number[];
  phase_deg?: readonly number[];
}

/** Presentation properties copied from the live element so the file looks as on screen. */
const STYLE_PROPERTIES = [
  'fill', 'fill-opacity', 'stroke', 'stroke-width', 'stroke-dasharray', 'stroke-opacity', 'opacity',
  'font-family', 'font-size', 'font-weight', 'text-anchor', 'dominant-baseline', 'paint-order', 'stroke-linejoin',
] as const;

/**
 * CSV of the curves: `freq_hz`, then `<key>_mag_db` and `<key>_phase_deg` per curve.
 * Numbers are written in full (shortest round-trip form), so they equal the plotted ones.
 */
export function curvesCsv(freqHz: readonly number[], curves: readonly CsvCurve[]): string {
  const header = ['freq_hz'];
  for (const c of curves) {
    header.push(`${c.key}_mag_db`);
    if (c.phase_deg) header.push(`${c.key}_phase_deg`);
  }
  const rows = [header.map(csvField).join(',')];
  for (let k = 0; k < freqHz.length; k++) {
    const row = [String(freqHz[k])];
    for (const c of curves) {
      row.push(String(c.db[k]));
      if (c.phase_deg) row.push(String(c.phase_deg[k]));
    }
    rows.push(row.join(','));
  }
  return rows.join('\r\n') + '\r\n';
}

/** RFC 4180 quoting: names like `ac(a, b)` hold a comma. */
function csvField(text: string): string {
  return /[",\r\n]/.test(text) ? `"${text.replaceAll('"', '""')}"` : text;
}

/**
 * The SVG as a standalone document: computed presentation styles inlined, elements marked
 * `data-export="skip"` (cursor, zoom box) left out, explicit size and namespace.
 */
export function serializeSvg(svg: SVGSVGElement): string {
  const clone = svg.cloneNode(true) as SVGSVGElement;
  inlineStyles(svg, clone);
  clone.querySelectorAll('[data-export="skip"]').forEach((el) => el.remove());
  const { width, height } = exportSize(svg);
  clone.setAttribute('xmlns', 'http://www.w3.org/2000/svg');
  clone.setAttribute('width', String(width));
  clone.setAttribute('height', String(height));
  clone.setAttribute('viewBox', `0 0 ${width} ${height}`);
  clone.querySelector('rect.paper')?.setAttribute('height', String(height));
  clone.removeAttribute('data-export-extra');
  clone.removeAttribute('tabindex');
  clone.removeAttribute('class');
  return '<?xml version="1.0" encoding="UTF-8"?>\n' + new XMLSerializer().serializeToString(clone);
}

/** Width and height the SVG is drawn at (attributes first; layout when they are missing). */
export function svgSize(svg: SVGSVGElement): { width: number; height: number } {
  const width = Number(svg.getAttribute('width')) || svg.clientWidth || 640;
  const height = Number(svg.getAttribute('height')) || svg.clientHeight || 360;
  return { width, height };
}

/** Size of the exported file: the plot plus the legend rows drawn below it (`data-export-extra`). */
export function exportSize(svg: SVGSVGElement): { width: number; height: number } {
  const { width, height } = svgSize(svg);
  return { width, height: height + (Number(svg.getAttribute('data-export-extra')) || 0) };
}

function inlineStyles(source: Element, target: Element): void {
  const view = source.ownerDocument.defaultView;
  if (view && typeof view.getComputedStyle === 'function') {
    const computed = view.getComputedStyle(source);
    const declarations: string[] = [];
    for (const prop of STYLE_PROPERTIES) {
      const value = computed.getPropertyValue(prop);
      if (value && !target.hasAttribute(prop)) declarations.push(`${prop}: ${value}`);
    }
    const own = target.getAttribute('style');
    if (declarations.length > 0) target.setAttribute('style', [own, ...declarations].filter(Boolean).join('; '));
  }
  const sourceChildren = source.children;
  const targetChildren = target.children;
  for (let k = 0; k < sourceChildren.length && k < targetChildren.length; k++) inlineStyles(sourceChildren[k], targetChildren[k]);
}

/** Renders SVG text to a PNG at `scale`× on a 2D canvas, over the paper colour. */
export function svgToPng(svgText: string, width: number, height: number, scale = 2, background = '#FFFDF8'): Promise<Blob> {
  return new Promise((resolve, reject) => {
    const url = URL.createObjectURL(new Blob([svgText], { type: 'image/svg+xml;charset=utf-8' }));
    const image = new Image();
    image.onload = () => {
      try {
        const canvas = document.createElement('canvas');
        canvas.width = Math.round(width * scale);
        canvas.height = Math.round(height * scale);
        const ctx = canvas.getContext('2d');
        if (!ctx) throw new Error('This browser offers no 2D canvas to draw the PNG.');
        ctx.fillStyle = background;
        ctx.fillRect(0, 0, canvas.width, canvas.height);
        ctx.scale(scale, scale);
        ctx.drawImage(image, 0, 0, width, height);
        canvas.toBlob((blob) => (blob ? resolve(blob) : reject(new Error('The PNG could not be encoded.'))), 'image/png');
      } catch (err) {
        reject(err instanceof Error ? err : new Error(String(err)));
      } finally {
        URL.revokeObjectURL(url);
      }
    };
    image.onerror = () => {
      URL.revokeObjectURL(url);
      reject(new Error('The plot could not be drawn as an image.'));
    };
    image.src = url;
  });
}

/** Offers `blob` as a download named `filename`. */
export function downloadBlob(blob: Blob, filename: string): void {
  const url = URL.createObjectURL(blob);
  const link = document.createElement('a');
  link.href = url;
  link.download = filename;
  link.style.display = 'none';
  document.body.appendChild(link);
  link.click();
  link.remove();
  setTimeout(() => URL.revokeObjectURL(url), 0);
}

/** A file-name-safe stem from a netlist title: "Resistor-tail pair" → "resistor-tail-pair". */
export function fileStem(title: string | undefined, fallback = 'nodewright'): string {
  const stem = (title ?? '').toLowerCase().normalize('NFKD').replace(/[^a-z0-9]+/g, '-').replace(/^-+|-+$/g, '').slice(0, 60);
  return stem || fallback;
}
