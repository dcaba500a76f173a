/**
 * The poles and zeros of `analyze poles`, read out of a solve result for the Poles panel: table
 * rows in the solver's order (sorted by |s|, a conjugate pair once, as the report and the
 * measures `pole(k)`, `zero(k)` count them), the points of the s-plane map (both members of a
 * pair), a summary in words, and the line to suggest when there is no poles analysis.
 *
 * Values are the solver's complex frequencies s/2π, already in hertz: |s|/2π is hypot(re, im)
 * of the numbers as given, with no further 2π.
 */
import type { PoleZero, PolesResult, SolveResult } from '../../../../../solver';
import { formatPlain, formatSi } from '../si-format';
import { suggestedOutput } from '../suggested-names';

export type PzKind = 'pole' | 'zero';

/** One row of the table: a real pole or zero, or a conjugate pair on one row (re ± j·im). */
export interface PzRow {
  kind: PzKind;
  /** 1-based within its kind, counting a pair once: `pole 2` is what `pole(2)` reads. */
  index: number;
  /** Re s/2π, Hz. */
  re: number;
  /** |Im s|/2π, Hz (0 for a real one). */
  im: number;
  /** Whether it stands for a conjugate pair. */
  pair: boolean;
  /** |s|/2π, Hz. */
  mag: number;
  /** Q = |s|/(−2·Re s) of a pair (negative in the right half-plane); undefined for a real one. */
  q?: number;
  /** In the right half-plane (Re s > 0): a growing mode for a pole, a non-minimum-phase zero. */
  rhp: boolean;
}

/** One point of the s-plane map. */
export interface PzPoint {
  kind: PzKind;
  re: number;
  im: number;
  rhp: boolean;
  /** What its tooltip says: "pole 2: −159 kHz ± j 1.20 MHz, |s|/2π 1.21 MHz, Q 3.80". */
  label: string;
}

/** The rows of `poles`: poles then zeros, each in the solver's order. */
export function pzRows(poles: PolesResult): PzRow[] {
  return [...rowsOf('pole', poles.poles_hz), ...rowsOf('zero', poles.zeros_hz)];
}

function rowsOf(kind: PzKind, list: readonly PoleZero[]): PzRow[] {
  // A pair is listed by its member with im > 0 (which comes first); a real one has im = 0.
  return list.filter((p) => p.im >= 0).map((p, k) => ({
    kind, index: k + 1, re: p.re, im: p.im, pair: p.im > 0, mag: Math.hypot(p.re, p.im),
    q: p.im > 0 ? p.q ?? qOf(p) : undefined, rhp: p.re > 0,
  }));
}

/** Q = |s|/(−2·Re s), for a pair the solver left without one. */
function qOf(p: PoleZero): number | undefined {
  return p.re !== 0 ? Math.hypot(p.re, p.im) / (-2 * p.re) : undefined;
}

/** The points of the map: every pole and zero, both members of a pair, each labelled by its row. */
export function pzPoints(poles: PolesResult): PzPoint[] {
  const points: PzPoint[] = [];
  for (const kind of ['pole', 'zero'] as const) {
    const list = kind === 'pole' ? poles.poles_hz : poles.zeros_hz;
    const rows = rowsOf(kind, list);
    // Rows follow the members with im ≥ 0 in order; a member with im < 0 takes its partner's row.
    const rowOf = new Map<PoleZero, PzRow>();
    let next = 0;
    for (const p of list) {
      let row: PzRow | undefined;
      if (p.im >= 0) row = rows[next++];
      else for (const [q, r] of rowOf) if (q.re === p.re && q.im === -p.im) row = r;
      if (row) rowOf.set(p, row);
      if (!Number.isFinite(p.re) || !Number.isFinite(p.im)) continue;
      points.push({ kind, re: p.re, im: p.im, rhp: p.re > 0, label: row ? rowText(row) : `${kind}: ${complexText(p.re, p.im)}` });
    }
  }
  return points;
}

/** "pole 2: −159 kHz ± j 1.20 MHz, |s|/2π 1.21 MHz, Q 3.80, right half-plane". */
export function rowText(r: PzRow): string {
  const parts = [`${r.kind} ${r.index}: ${complexText(r.re, r.im, r.pair)}`, `|s|/2π ${formatSi(r.mag, 'Hz')}`];
  if (r.q !== undefined) parts.push(`Q ${formatPlain(r.q)}`);
  if (r.rhp) parts.push('right half-plane');
  return parts.join(', ');
}

/** "−159 kHz", "−159 kHz ± j 1.20 MHz", "j 1.20 MHz" (on the imaginary axis). */
function complexText(re: number, im: number, pair = im !== 0): string {
  if (im === 0) return formatSi(re, 'Hz');
  const j = `j ${formatSi(Math.abs(im), 'Hz')}`;
  const sign = pair ? '±' : im < 0 ? '−' : '+';
  return re === 0 ? `${sign === '+' ? '' : sign + ' '}${j}` : `${formatSi(re, 'Hz')} ${sign} ${j}`;
}

/** How many natural frequencies a list holds, a conjugate pair counted once: "3 poles (1 conjugate pair)". */
function countText(list: readonly PoleZero[], what: PzKind): string {
  const distinct = list.filter((p) => p.im >= 0).length;
  const pairs = list.filter((p) => p.im > 0).length;
  return `${distinct} ${what}${distinct === 1 ? '' : 's'}${pairs > 0 ? ` (${pairs} conjugate pair${pairs === 1 ? '' : 's'})` : ''}`;
}

/** The map's and the table's summary: how many, whose zeros, and whether any pole is in the right half-plane. */
export function pzSummary(poles: PolesResult): { text: string; unstable: number } {
  const unstable = poles.poles_hz.filter((p) => p.re > 0 && p.im >= 0).length;
  const zeros = poles.zeros_of ? `${countText(poles.zeros_hz, 'zero')} of ${poles.zeros_of}` : 'no zeros asked for';
  const stability = poles.poles_hz.length === 0 ? ''
    : unstable === 0 ? ' Every pole is in the left half-plane: the circuit is stable at this operating point.'
      : ` ${unstable === 1 ? 'One pole is' : `${unstable} poles are`} in the right half-plane: the circuit is unstable at this operating point (a growing mode — it would oscillate or latch).`;
  return { text: `${countText(poles.poles_hz, 'pole')}; ${zeros}.${stability}`, unstable };
}

/**
 * The poles line to copy into a netlist without one: `analyze poles` (which gives the zeros of
 * adm when there are ports), or `analyze poles out NODE` for the zeros of the transfer to a node.
 */
export function suggestedPoles(result: SolveResult): string {
  return result.ports ? 'analyze poles' : `analyze poles out ${suggestedOutput(result).node}`;
}

/**
 * CSV of every pole and zero as the solver lists them (both members of a pair, im signed):
 * kind, its row's number, Re and Im s/2π, |s|/2π, Q and whether it is in the right half-plane.
 */
export function pzCsv(poles: PolesResult): string {
  const lines = ['kind,index,re_hz,im_hz,mag_hz,q,right_half_plane'];
  for (const kind of ['pole', 'zero'] as const) {
    let index = 0;
    for (const p of kind === 'pole' ? poles.poles_hz : poles.zeros_hz) {
      if (p.im >= 0) index++;
      const q = p.im !== 0 ? p.q ?? qOf(p) : undefined;
      lines.push([kind, index, p.re, p.im, Math.hypot(p.re, p.im), q === undefined ? '' : q, p.re > 0 ? 'yes' : 'no'].join(','));
    }
  }
  return lines.join('\r\n') + '\r\n';
}
