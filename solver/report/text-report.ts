/**
 * The readable report of a solve: what the command line prints without `--json`.
 * Plain text, aligned columns, SI prefixes and units; errors with line:col and hint.
 */
import type { Diagnostic } from '../circuit/diagnostic';
import type { BjtOp, ComplexFigure, DeviceOp, DiodeOp, MosOp, SolveResult } from '../circuit/result';
import { DEVICE_FIELDS } from '../language/vocabulary';
import { formatDb, formatDeg, formatFigure, formatPlain, formatSi } from './si-format';
import { noiseSection } from './noise-table';
import { polesSection } from './poles-table';
import { sweepSections } from './sweep-table';

/** The caution every report carries (design.md: "Cautions the product states"). */
export const CAUTION =
  'First-order device models: a topology sanity check, not a substitute for sign-off simulation with the foundry\'s models, nor for the team\'s review and local design rules.';

/** Left-aligned first column, right-aligned others, two spaces between. */
export function table(header: string[], rows: string[][], indent = '  '): string[] {
  const all = [header, ...rows];
  const widths = header.map((_, c) => Math.max(...all.map((r) => (r[c] ?? '').length)));
  return all.map((r) =>
    (indent + r.map((cell, c) => (c === 0 ? cell.padEnd(widths[c]) : cell.padStart(widths[c]))).join('  ')).trimEnd(),
  );
}

function section(title: string, lines: string[]): string[] {
  return lines.length === 0 ? [] : ['', title, ...lines];
}

/** The operating-point columns of each device table; units and meanings come from the vocabulary. */
const BJT_COLUMNS = ['ic', 'ib', 'vbe', 'vce', 'gm', 'rpi', 'ro', 'cpi', 'cmu'] as const;
const MOS_COLUMNS = ['id', 'vgs', 'vds', 'vov', 'vth', 'gm', 'gds', 'cgs', 'cgd'] as const;
const DIODE_COLUMNS = ['id', 'vd', 'gd', 'cj'] as const;

/** The named fields of a device's operating point, each with its unit. */
function cells<T extends DeviceOp>(d: T, columns: readonly (keyof T & string)[]): string[] {
  return columns.map((c) => formatSi(d[c] as number, DEVICE_FIELDS[c].unit));
}

function deviceRows(devices: Record<string, DeviceOp>): string[] {
  const bjts = Object.entries(devices).filter((e): e is [string, BjtOp] => e[1].kind === 'npn' || e[1].kind === 'pnp');
  const mos = Object.entries(devices).filter((e): e is [string, MosOp] => e[1].kind === 'nmos' || e[1].kind === 'pmos');
  const diodes = Object.entries(devices).filter((e): e is [string, DiodeOp] => e[1].kind === 'diode');
  const out: string[] = [];
  if (bjts.length) {
    out.push(
      ...table(
        ['bipolar', 'kind', 'region', ...BJT_COLUMNS],
        bjts.map(([n, d]) => [n, d.kind, d.region, ...cells(d, BJT_COLUMNS)]),
      ),
    );
  }
  if (mos.length) {
    if (out.length) out.push('');
    out.push(
      ...table(
        ['MOS', 'kind', 'region', ...MOS_COLUMNS],
        mos.map(([n, d]) => [n, d.kind, d.region, ...cells(d, MOS_COLUMNS)]),
      ),
    );
  }
  if (diodes.length) {
    if (out.length) out.push('');
    out.push(...table(['diode', 'region', ...DIODE_COLUMNS], diodes.map(([n, d]) => [n, d.region, ...cells(d, DIODE_COLUMNS)])));
  }
  return out;
}

function figure(f: ComplexFigure): string[] {
  const value = f.im === 0 ? formatPlain(f.re) : `${formatPlain(f.re)} ${f.im < 0 ? '−' : '+'} ${formatPlain(Math.abs(f.im))}j`;
  return [value, formatDb(f.db), formatDeg(f.phase_deg)];
}

function diagnosticLine(d: Diagnostic): string {
  return `  ${d.line}:${d.col}  ${d.message}${d.hint ? `  (hint: ${d.hint})` : ''}`;
}

/** Wraps long text at word boundaries to `width` columns with `indent`. */
function wrap(text: string, width: number, indent: string): string[] {
  const out: string[] = [];
  let line = '';
  for (const word of text.split(/\s+/)) {
    if (line && (indent + line + ' ' + word).length > width) {
      out.push(indent + line);
      line = word;
    } else line = line ? `${line} ${word}` : word;
  }
  if (line) out.push(indent + line);
  return out;
}

/** The whole report as one string ending in a newline. */
export function formatReport(result: SolveResult): string {
  const lines: string[] = [];
  lines.push(result.title || '(untitled netlist)');
  lines.push(`Nodewright · ${result.temp_c} °C`);
  lines.push(...wrap(CAUTION, 100, ''));

  const op = result.op;
  if (op) {
    lines.push(...section('Nodes', table(['node', 'voltage'], Object.entries(op.nodes).map(([n, v]) => [n, formatSi(v, 'V')]))));
    lines.push(...section('Sources', table(['source', 'v', 'i (p→n through it)'], Object.entries(op.sources).map(([n, s]) => [n, formatSi(s.v, 'V'), formatSi(s.i, 'A')]))));
    lines.push(...section('Parts', table(['part', 'i (a→b)', 'v (a−b)'], Object.entries(op.parts).map(([n, p]) => [n, formatSi(p.i, 'A'), formatSi(p.v, 'V')]))));
    lines.push(...section('Devices', deviceRows(op.devices)));
  }

  const ports = result.ports;
  if (ports) {
    const rows = [
      ['adm', ...figure(ports.adm)],
      ['acm', ...figure(ports.acm)],
      ['cmrr', formatPlain(ports.cmrr), formatDb(ports.cmrr_db), ''],
    ];
    lines.push(...section(`Ports (${ports.output} output, at ${formatSi(ports.at_hz, 'Hz')})`, table(['figure', 'value', 'dB', 'phase'], rows)));
    lines.push(...wrap(ports.conventions, 100, '  '));
  }

  if (result.ac) {
    const f = result.ac.freq_hz;
    const span = f.length ? `${formatSi(f[0], 'Hz')} to ${formatSi(f[f.length - 1], 'Hz')}, ${f.length} points` : 'no points';
    lines.push(...section('AC sweep', [`  ${span}; curves: ${Object.keys(result.ac.curves).join(', ')}`]));
  }
  if (result.transfer) {
    const x = result.transfer.x;
    const span = x.length ? `${formatPlain(x[0])} to ${formatPlain(x[x.length - 1])}, ${x.length} points` : 'no points';
    lines.push(...section('Transfer', [`  ${result.transfer.source} from ${span}; curves: ${Object.keys(result.transfer.curves).join(', ')}`]));
  }

  const noise = noiseSection(result);
  if (noise) {
    const spot = noise.contributors.length > 1 ? ['', `  ${noise.spot}`, ...table(noise.contributors[0], noise.contributors.slice(1), '    ')] : [];
    lines.push(...section(noise.title, [...table(noise.densities[0], noise.densities.slice(1)), `  ${noise.rms}`, ...spot]));
  }

  const poles = polesSection(result);
  if (poles) {
    lines.push(...section(poles.title, [...table(poles.rows[0], poles.rows.slice(1)), ...poles.notes.map((n) => `  ${n}`)]));
    if (result.poles) lines.push(...wrap(result.poles.conventions, 100, '  '));
  }

  for (const sweep of sweepSections(result)) lines.push(...section(sweep.title, table(sweep.rows[0], sweep.rows.slice(1))));

  const measures = Object.entries(result.measures);
  lines.push(...section('Measures', table(['measure', 'value'], measures.map(([n, v]) => [n, formatFigure(v)]))));

  lines.push(
    ...section(
      'Checks',
      table(
        ['', 'check', 'value', 'limit', 'margin', 'line'],
        result.checks.map((c) => [c.pass ? 'PASS' : 'FAIL', c.text, formatFigure(c.value), formatFigure(c.limit), formatFigure(c.margin), String(c.line)]),
      ),
    ),
  );
  if (result.checks.length) {
    const passed = result.checks.filter((c) => c.pass).length;
    lines.push(`  ${passed} of ${result.checks.length} checks pass`);
  }

  lines.push(...section(`Warnings (${result.warnings.length})`, result.warnings.map(diagnosticLine)));
  lines.push(...section(`Errors (${result.errors.length})`, result.errors.map(diagnosticLine)));
  if (result.errors.length === 0) lines.push('', 'Solved.');
  return lines.join('\n') + '\n';
}
