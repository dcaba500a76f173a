/**
 * The readable report's poles section: one row per natural frequency — a conjugate pair on one
 * row as re ± j·im, so `pole 2` in the table is what the measure pole(2) reads — with |s|/2π and
 * the q of a complex pair, poles first, then the zeros of the transfer named in the result.
 */
import type { PoleZero, PolesResult } from '../circuit/result';
import { formatPlain, formatSi } from './si-format';

/** Most rows of each list (the rest are counted in a line below the table). */
export const MAX_POLE_ROWS = 20;

/** The list with each conjugate pair once (the member with im > 0, which comes first). */
function distinct(list: readonly PoleZero[]): PoleZero[] {
  return list.filter((p) => p.im >= 0);
}

function row(label: string, p: PoleZero): string[] {
  return [
    label,
    formatSi(p.re, 'Hz'),
    p.im === 0 ? '' : `± ${formatSi(p.im, 'Hz')}`,
    formatSi(Math.hypot(p.re, p.im), 'Hz'),
    p.q === undefined ? '' : formatPlain(p.q),
    p.re > 0 ? 'right half-plane' : '',
  ];
}

/** The section's table (header first) and the lines under it, or undefined without a poles member. */
export function polesSection(result: { poles?: PolesResult }): { title: string; rows: string[][]; notes: string[] } | undefined {
  const poles = result.poles;
  if (!poles) return undefined;
  const rows: string[][] = [['', 're', 'im', '|s|/2π', 'q', '']];
  const notes: string[] = [];
  const add = (kind: 'pole' | 'zero', list: readonly PoleZero[]) => {
    const shown = distinct(list);
    shown.slice(0, MAX_POLE_ROWS).forEach((p, k) => rows.push(row(`${kind} ${k + 1}`, p)));
    if (shown.length > MAX_POLE_ROWS) notes.push(`${shown.length - MAX_POLE_ROWS} further ${kind}s are in the JSON result (--json).`);
  };
  add('pole', poles.poles_hz);
  add('zero', poles.zeros_hz);
  const pairs = (list: readonly PoleZero[]) => list.filter((p) => p.im > 0).length;
  const count = (list: readonly PoleZero[], what: string) => `${list.length} ${what}${list.length === 1 ? '' : 's'}${pairs(list) ? ` (${pairs(list)} conjugate pair${pairs(list) === 1 ? '' : 's'})` : ''}`;
  const summary = `${count(poles.poles_hz, 'pole')}; ${poles.zeros_of ? `${count(poles.zeros_hz, 'zero')} of ${poles.zeros_of}` : 'no zeros asked for (they need `ports`, or `analyze poles out NODE`)'}.`;
  return { title: 'Poles and zeros', rows, notes: [summary, ...notes] };
}
