/**
 * The readable report's tables for `vary` and `temp` (one row per value with the ports figures,
 * every measure and how many checks pass; a value where the circuit did not solve says so) and
 * for `mismatch` (the statistics of each figure and the yield of the checks) and `sensitivity`
 * (the five largest per figure).
 */
import type { SolveResult, SweepRun } from '../circuit/result';
import { formatDb, formatFigure, formatSi } from './si-format';

/** The rows of one sweep under its header (empty when there is no sweep). */
export function sweepRows(labelHeader: string, labels: readonly string[], runs: readonly SweepRun[]): string[][] {
  const measures = [...new Set(runs.flatMap((r) => Object.keys(r.measures)))];
  const withPorts = runs.some((r) => r.ports);
  const header = [labelHeader, ...(withPorts ? ['adm dB', 'acm dB', 'cmrr dB'] : []), ...measures, 'checks'];
  const rows = runs.map((run, k) => {
    if (run.errors) return [labels[k], `did not solve: ${run.errors[0].message}`];
    const p = run.ports;
    const ports = withPorts ? (p ? [formatDb(p.adm.db), formatDb(p.acm.db), formatDb(p.cmrr_db)] : ['—', '—', '—']) : [];
    const passed = run.checks.filter((c) => c.pass).length;
    return [labels[k], ...ports, ...measures.map((m) => (m in run.measures ? formatFigure(run.measures[m]) : '—')), run.checks.length ? `${passed} of ${run.checks.length}` : '—'];
  });
  return [header, ...rows];
}

/** The sweep sections of a result: title and rows (header first). */
export function sweepSections(result: SolveResult): { title: string; rows: string[][] }[] {
  const out: { title: string; rows: string[][] }[] = [];
  if (result.vary) {
    const v = result.vary;
    out.push({ title: `Vary ${v.param} (${v.values.length} values)`, rows: sweepRows(v.param, v.values.map((x) => formatSi(x)), v.runs) });
  }
  if (result.mismatch) {
    const m = result.mismatch;
    const solved = m.runs - m.failed_runs;
    const stat = (v: number) => formatFigure(v);
    out.push({
      title: `Mismatch (${solved} of ${m.runs} runs solved, seed ${m.seed}; checks all pass in ${(m.yield * 100).toFixed(1)} % of them)`,
      rows: [['figure', 'mean', 'sd', 'min', 'p5', 'p50', 'p95', 'max'], ...Object.entries(m.stats).map(([name, s]) => [name, stat(s.mean), stat(s.sd), stat(s.min), stat(s.p5), stat(s.p50), stat(s.p95), stat(s.max)])],
    });
  }
  if (result.sensitivity) {
    const rows: string[][] = [['figure', 'rank', 'part or model', 'parameter', 'S = (∂F/F)/(∂x/x)']];
    for (const [name, list] of Object.entries(result.sensitivity.figures)) {
      list.slice(0, 5).forEach((x, k) => rows.push([k === 0 ? name : '', String(k + 1), x.target, x.param, x.s.toFixed(4)]));
    }
    out.push({ title: `Sensitivity (what moves each figure most; central differences, step ±${result.sensitivity.step * 100} %)`, rows });
  }
  if (result.temp) {
    const t = result.temp;
    out.push({ title: `Temperature (${t.values_c.length} values)`, rows: sweepRows('°C', t.values_c.map((x) => String(x)), t.runs) });
  }
  return out;
}
