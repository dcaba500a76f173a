/**
 * Exporting a plot: the SVG itself (its own small stylesheet travels inside it; nothing of the
 * page's framework comes along), a PNG rendered from that SVG on a 2D canvas at twice the size
 * (no GPU needed), and its curves as CSV.
 */
import { PLOT_CLASS } from './plot-style';

/** One exported curve: the numbers exactly as plotted. */
export interface CsvCurve {
  key: string;
  db: readonly number[];
  phase_deg?: readonly number[];
}

/**
 * CSV of the curves: `freq_hz`, then `<key>_mag_db` and `<key>_phase_deg` per curve.
 * Numbers are written in full (shortest round-trip form), so they equal the plotted ones.
 */
export function curvesCsv(freqHz: readonly number[], curves: readonly CsvCurve[]): string {
  const columns: CsvColumn[] = [{ name: 'freq_hz', values: freqHz }];
  for (const c of curves) {
    columns.push({ name: `${c.key}_mag_db`, values: c.db });
    if (c.phase_deg) columns.push({ name: `${c.key}_phase_deg`, values: c.phase_deg });
  }
  return columnsCsv(columns);
}

/** A named column of numbers. */
export interface CsvColumn {
  name: string;
  values: readonly number[];
}

/**
 * CSV of columns, one row per sample of the first column; RFC 4180 quoting, CRLF rows. A value
 * that is not a number (a point where a figure is undefined) is an empty field, never "NaN".
 */
export function columnsCsv(columns: readonly CsvColumn[]): string {
  const rows = [columns.map((c) => csvField(c.name)).join(',')];
  const n = columns[0]?.values.length ?? 0;
  const field = (v: number | undefined) => (v !== undefined && Number.isFinite(v) ? String(v) : '');
  for (let k = 0; k < n; k++) rows.push(columns.map((c) => field(c.values[k])).join(','));
  return rows.join('\r\n') + '\r\n';
}

/** RFC 4180 quoting: names like `ac(a, b)` hold a comma. */
function csvField(text: string): string {
  return /[",\r\n]/.test(text) ? `"${text.replaceAll('"', '""')}"` : text;
}

/** Attributes that belong to the page, not the picture: Angular's, ARIA's, focus. */
const PAGE_ATTRIBUTE = /^(_ng|ng-|aria-|tabindex$|role$|data-export)/;

/**
 * The SVG as a standalone document: elements marked `data-export="skip"` (cursor, zoom box) left
 * out, attributes of the page (Angular's `_ngcontent-*`/`ng-reflect-*`, ARIA, focus) stripped,
 * the embedded stylesheet kept as the one source of shared looks, explicit size and namespace.
 */
export function serializeSvg(svg: SVGSVGElement): string {
  const clone = svg.cloneNode(true) as SVGSVGElement;
  clone.querySelectorAll('[data-export="skip"]').forEach((el) => el.remove());
  for (const el of [clone, ...clone.querySelectorAll('*')]) {
    for (const name of el.getAttributeNames()) if (PAGE_ATTRIBUTE.test(name)) el.removeAttribute(name);
  }
  const { width, height } = exportSize(svg);
  // No xmlns attribute by hand: the serializer writes the SVG namespace of the element itself,
  // and one set as a plain attribute as well comes out twice (a file no XML reader opens).
  clone.removeAttribute('xmlns');
  clone.setAttribute('width', String(width));
  clone.setAttribute('height', String(height));
  clone.setAttribute('viewBox', `0 0 ${width} ${height}`);
  clone.querySelector('rect.paper')?.setAttribute('height', String(height));
  // Only the stylesheet's scoping class stays on the root (the page's own classes go).
  clone.setAttribute('class', PLOT_CLASS);
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
