/**
 * How the team pages write times and sizes: short relative phrases in the tables, with the
 * absolute time kept for a title attribute.
 */

const MINUTE = 60_000;
const HOUR = 60 * MINUTE;
const DAY = 24 * HOUR;

/** How long deleted netlists stay restorable (docs/api.md). */
export const RESTORABLE_DAYS = 30;

/**
 * "just now", "3 min ago", "5 h ago", "yesterday", "4 days ago", then a date; for times ahead
 * "in 3 min", "in 6 days". `now` is a parameter so tests do not depend on the clock.
 */
export function relativeTime(iso: string, now = Date.now()): string {
  const then = Date.parse(iso);
  if (Number.isNaN(then)) return '';
  const diff = now - then;
  const ahead = diff < 0;
  const abs = Math.abs(diff);
  if (abs < 45_000) return ahead ? 'in a moment' : 'just now';
  const span = (n: number, unit: string) => (ahead ? `in ${n} ${unit}` : `${n} ${unit} ago`);
  const m = Math.round(abs / MINUTE);
  if (m < 60) return span(m, 'min');
  const h = Math.round(abs / HOUR);
  if (h < 24) return span(h, 'h');
  const d = Math.round(abs / DAY);
  if (d === 1) return ahead ? 'tomorrow' : 'yesterday';
  if (d < 14) return span(d, 'days');
  const sameYear = new Date(then).getFullYear() === new Date(now).getFullYear();
  const date = new Date(then).toLocaleDateString('en-GB', { day: 'numeric', month: 'short', year: sameYear ? undefined : 'numeric' });
  return ahead ? `on ${date}` : date;
}

/** "12 Mar 2026, 14:05" in the user's time zone, for title attributes and expiries. */
export function absoluteTime(iso: string): string {
  const t = Date.parse(iso);
  if (Number.isNaN(t)) return '';
  return new Date(t).toLocaleString('en-GB', { day: 'numeric', month: 'short', year: 'numeric', hour: '2-digit', minute: '2-digit' });
}

/** Bytes as "812 B", "4.2 kB", "38 kB", "1.1 MB" (decimal units, as the server's limits are). */
export function formatSize(bytes: number): string {
  if (!Number.isFinite(bytes) || bytes < 0) return '';
  if (bytes < 1000) return `${bytes} B`;
  const kb = bytes / 1000;
  if (kb < 10) return `${kb.toFixed(1)} kB`;
  if (kb < 1000) return `${Math.round(kb)} kB`;
  return `${(kb / 1000).toFixed(1)} MB`;
}

/**
 * Whole days left before a netlist deleted at `deletedAt` can no longer be restored; 0 on its
 * last day or after.
 */
export function restorableDaysLeft(deletedAt: string, now = Date.now()): number {
  const t = Date.parse(deletedAt);
  if (Number.isNaN(t)) return 0;
  const left = t + RESTORABLE_DAYS * DAY - now;
  return left <= 0 ? 0 : Math.floor(left / DAY);
}

/** The sentence shown next to a deleted netlist. */
export function restorableText(deletedAt: string, now = Date.now()): string {
  const d = restorableDaysLeft(deletedAt, now);
  if (d === 0) return 'Last day to restore';
  return d === 1 ? '1 day left to restore' : `${d} days left to restore`;
}

/** A file name for downloading a netlist: its name without path or reserved characters, `.nwl`. */
export function nwlFileName(name: string): string {
  const base = name.replace(/[\\/:*?"<>|\u0000-\u001f]+/g, ' ').replace(/\s+/g, ' ').trim().replace(/\.nwl$/i, '');
  return `${base || 'netlist'}.nwl`;
}
