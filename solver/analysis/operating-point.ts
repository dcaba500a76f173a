/**
 * The DC operating point: Newton–Raphson with junction limiting, then gmin stepping, then
 * source stepping, each bounded; when all fail, a clean OpFailure naming the nodes and devices
 * that failed to settle.
 *
 * gmin stepping (a conductance from every node to ground, started large and lowered a decade at
 * a time, each solve warm-started from the last) and source stepping (all independent sources
 * ramped from 0 to 100 %) are the standard continuation methods for hard DC problems.
 */
import { diagnostic, type Diagnostic, type DiagnosticCode, type SourceLoc } from '../circuit/diagnostic';
import { partNodes, type Circuit } from '../circuit/types';
import type { OperatingPoint, OpFailure } from './engine-api';
import type { MnaLayout } from './mna';
import { borrowWorkspace, NewtonWorkspace, releaseWorkspace, runNewton, type IterationWatch } from './newton';
import { SettleWatch, unbalancedNodes, type Unbalanced, type Unsettled } from './settle-watch';
import { formatSi } from '../report/si-format';
import { buildOpReport, reportIsFinite } from './op-report';

/** First conductance of gmin stepping, in S. */
export const GMIN_START = 1e-2;
/** Bound on the continuation steps of each stepping method. */
export const MAX_STEPS = 60;
/** Newton iterations allowed per continuation step (each step starts next to its solution). */
export const STEP_ITER_LIMIT = 100;
/** Total Newton iterations one operating point may spend over all strategies: no input hangs the solver. */
export const TOTAL_ITER_BUDGET = 20000;

/** How a solve may start: a neighbouring solution (warm start) or cold. */
export interface OpStart {
  x?: Float64Array;
}

/** What each strategy got to, for the failure message. */
interface Attempts {
  newtonIterations: number;
  gminReached?: number;
  sourceReached?: number;
  /** At the end of plain Newton (the full problem): nodes out of balance, devices still moving. */
  unbalanced: Unbalanced[];
  unsettled: Unsettled[];
  /** Rows with the largest last step, for when no node is out of balance. */
  moving: { row: number; update: number }[];
  singularRow: number;
  /** Where plain Newton's matrix was still numerically singular when it stopped (its steps damped), or −1. */
  dampedAt: number;
}

/** Solves the DC operating point of `circuit`. Never throws. */
export function solveOperatingPoint(circuit: Circuit, start?: OpStart): OperatingPoint | OpFailure {
  const ws = borrowWorkspace(circuit);
  const op = solveWithWorkspace(ws, start);
  releaseWorkspace(ws);
  return op;
}

/** Type guard for the failure branch. */
export function isOpFailure<T extends object>(r: T | OpFailure): r is OpFailure {
  return (r as OpFailure).failed === true;
}

/** The strategy ladder on a prepared workspace (reused by DC sweeps). */
export function solveWithWorkspace(ws: NewtonWorkspace, start?: OpStart): OperatingPoint | OpFailure {
  const c = converge(ws, start);
  return isOpFailure(c) ? c : success(ws, c.x, c.method, c.iterations);
}

/**
 * The ladder's converged unknowns only, with no report: for a search that reads a node or two per
 * solve (the mismatch input-offset search), where building the report was a fifth of the work.
 * Indexed by the workspace's layout; the caller's own array.
 */
export function solveUnknowns(ws: NewtonWorkspace, start?: OpStart): Float64Array | OpFailure {
  const c = converge(ws, start);
  return isOpFailure(c) ? c : c.x;
}

/** What the ladder converged to. */
interface Converged {
  x: Float64Array;
  method: string;
  iterations: number;
}

function converge(ws: NewtonWorkspace, start?: OpStart): Converged | OpFailure {
  const { circuit, layout, n } = ws;
  const bad = findBadValue(circuit);
  if (bad) return bad;
  const { minG, maxIter } = circuit.options;
  const iterLimit = Math.max(1, Math.min(Math.floor(Number.isFinite(maxIter) ? maxIter : 200), 100000));
  const gminFinal = Number.isFinite(minG) && minG > 0 ? minG : 0;
  const x = new Float64Array(n);
  let total = 0;
  const attempts: Attempts = { newtonIterations: 0, unbalanced: [], unsettled: [], moving: [], singularRow: -1, dampedAt: -1 };
  const budget = Math.min(TOTAL_ITER_BUDGET, 20 * iterLimit + 1000);
  const stepLimit = Math.min(iterLimit, STEP_ITER_LIMIT);
  /** One bounded Newton run; out of budget counts as not converged. */
  const newton = (limit: number, watch?: IterationWatch) => {
    const result = runNewton(ws, x, Math.max(0, Math.min(limit, budget - total)), watch);
    total += result.iterations;
    return result;
  };

  // 1. Plain Newton, warm or cold.
  if (start?.x && start.x.length === n) {
    x.set(start.x);
    ws.devices.stateFrom(x);
  } else {
    ws.devices.initialGuess();
  }
  ws.prepare(1, gminFinal);
  const watch = ws.devices.count > 0 ? settleWatch(ws) : undefined;
  let out = newton(iterLimit, watch);
  attempts.newtonIterations = out.iterations;
  attempts.singularRow = out.singularRow;
  attempts.dampedAt = out.dampedAt ?? -1;
  if (out.converged) return { x, method: 'newton', iterations: total };
  attempts.unbalanced = unbalancedNodes(ws, layout);
  attempts.unsettled = watch?.unsettled() ?? [];
  attempts.moving = movingRows(ws);

  // 2. gmin stepping from GMIN_START down to min_g, a decade at a time (finer after a failure).
  {
    x.fill(0);
    ws.devices.initialGuess();
    const good = new Float64Array(n);
    let gmin = Math.max(GMIN_START, gminFinal);
    let factor = 10;
    let ok = false;
    let haveGood = false;
    for (let step = 0; step < MAX_STEPS && total < budget; step++) {
      ws.prepare(1, gmin);
      out = newton(stepLimit);
      if (out.converged) {
        good.set(x);
        haveGood = true;
        attempts.gminReached = gmin;
        if (gmin <= gminFinal) {
          ok = true;
          break;
        }
        gmin = Math.max(gmin / factor, gminFinal);
        factor = Math.min(factor * 2, 10);
      } else {
        if (!haveGood) break; // could not even start: source stepping is the better bet
        x.set(good);
        ws.devices.stateFrom(x);
        const last = attempts.gminReached!;
        factor = Math.sqrt(factor);
        if (factor < 1.01) break;
        gmin = Math.max(last / factor, gminFinal);
      }
    }
    if (ok) return { x, method: 'gmin-stepping', iterations: total };
  }

  // 3. Source stepping: every independent source ramped 0 → 100 % with an adaptive step.
  {
    x.fill(0);
    ws.devices.initialGuess();
    const good = new Float64Array(n);
    let step = 0.1;
    let reached = -1;
    for (let k = 0; k < MAX_STEPS * 3 && total < budget; k++) {
      const target = reached < 0 ? 0 : Math.min(1, reached + step);
      ws.prepare(target, gminFinal);
      out = newton(stepLimit);
      if (out.converged) {
        reached = target;
        good.set(x);
        attempts.sourceReached = reached;
        if (reached >= 1) return { x, method: 'source-stepping', iterations: total };
        step = Math.min(step * 1.5, 0.5);
      } else {
        if (reached < 0) break;
        x.set(good);
        ws.devices.stateFrom(x);
        step /= 4;
        if (step < 1e-4) break;
      }
    }
  }
  return failure(ws, layout, attempts, iterLimit, gminFinal);
}

/** One watch per workspace, reused by every solve on it (a DC sweep solves thousands of points). */
const watches = new WeakMap<NewtonWorkspace, SettleWatch>();

function settleWatch(ws: NewtonWorkspace): SettleWatch {
  let watch = watches.get(ws);
  if (!watch) {
    watch = new SettleWatch(ws);
    watches.set(ws, watch);
  }
  watch.reset();
  return watch;
}

/** Builds the OperatingPoint from a converged x (checked finite). */
function success(ws: NewtonWorkspace, x: Float64Array, method: string, iterations: number): OperatingPoint | OpFailure {
  const { report, warnings } = buildOpReport(ws.circuit, ws.layout, ws.devices, x);
  if (!reportIsFinite(report)) {
    return { failed: true, errors: [error('op-non-finite', firstLoc(ws.circuit), 'The DC operating point produced a non-finite value.', 'check for extreme part values')] };
  }
  return {
    circuit: ws.circuit,
    x,
    nodeIndex: ws.layout.nodeIndex,
    branchIndex: ws.layout.branchIndex,
    report,
    warnings,
    method,
    iterations,
  };
}

/** The voltage rows with the largest non-zero last step, largest first. */
function movingRows(ws: NewtonWorkspace): Attempts['moving'] {
  const rows: Attempts['moving'] = [];
  for (let i = 0; i < ws.layout.voltageCount; i++) {
    const update = ws.update[i];
    if (Number.isFinite(update) && update !== 0) rows.push({ row: i, update });
  }
  return rows.sort((a, b) => Math.abs(b.update) - Math.abs(a.update)).slice(0, 3);
}

/** How a row's node reads in a message: its name, or what an internal node belongs to. */
function nodeLabel(name: string): string {
  return name.endsWith(':base') ? `the internal base of ${name.slice(0, -5)}` : name;
}

/** "a, b and c". */
function listOf(items: string[]): string {
  return items.length <= 1 ? items.join('') : `${items.slice(0, -1).join(', ')} and ${items[items.length - 1]}`;
}

function failure(ws: NewtonWorkspace, layout: MnaLayout, a: Attempts, iterLimit: number, gminFinal: number): OpFailure {
  const circuit = ws.circuit;
  const singularAt = a.singularRow >= 0 ? a.singularRow : a.dampedAt;
  if (a.singularRow >= 0 && !ws.topologyOk) {
    const label = layout.rowLabels[a.singularRow] ?? `row ${a.singularRow}`;
    return {
      failed: true,
      errors: [error('op-singular', locOfRow(circuit, layout.rowNames[a.singularRow]), `The DC system cannot be solved at ${label}: it has no DC path to ground or sits in a loop of voltage sources or inductors.`,
        'give every node a DC path to ground and break loops of voltage sources')],
    };
  }
  if (singularAt >= 0) {
    // A circuit that passes the topology checks: its matrix lost its precision, which is a
    // numerical failure and is reported as one, never as a missing path or a source loop.
    const label = layout.rowLabels[singularAt];
    const where = label ? ` at ${label}` : '';
    return {
      failed: true,
      errors: [error('op-numerically-singular', locOfRow(circuit, layout.rowNames[singularAt]),
        `The DC system is numerically singular${where}: its equations lost all precision there (a numerical failure — every node has a DC path to ground and no sources form a loop); damped Newton steps, gmin stepping and source stepping did not get past it.`,
        'look for part values many orders of magnitude apart (a huge resistance beside a tiny one, an enormous gain), or a long chain of high-gain stages with no bias of their own')],
    };
  }
  const tried = [
    `Newton–Raphson (${a.newtonIterations} of ${iterLimit} iterations)`,
    `gmin stepping from ${GMIN_START} S to ${gminFinal} S${a.gminReached !== undefined ? ` (converged down to ${a.gminReached.toPrecision(2)} S)` : ' (no step converged)'}`,
    `source stepping 0 → 100 %${a.sourceReached !== undefined ? ` (reached ${(a.sourceReached * 100).toFixed(1)} %)` : ' (no step converged)'}`,
  ];
  // What failed to settle, in the designer's terms: nodes whose currents do not add up, devices
  // whose junctions kept swinging; without either, the nodes that moved most in the last step.
  const findings: string[] = [];
  if (a.unbalanced.length > 0) {
    findings.push(`the currents do not add up at ${listOf(a.unbalanced.map((u) => `${nodeLabel(u.name)} (${formatSi(Math.abs(u.residual), 'A', 3)} left over)`))}`);
  }
  if (a.unsettled.length > 0) {
    findings.push(`${listOf(a.unsettled.map((d) => `${d.name} (${d.junction} swinging by ${formatSi(d.swing, 'V', 3)})`))} kept moving`);
  }
  if (findings.length === 0 && a.moving.length > 0) {
    findings.push(`the nodes ${listOf(a.moving.map((m) => `${nodeLabel(layout.rowNames[m.row])} (last step ${formatSi(m.update, 'V', 3)})`))} were still moving`);
  }
  const where = findings.length > 0 ? `: ${findings.join(', and ')}` : '';
  const firstNode = a.unbalanced[0]?.name ?? (a.moving[0] ? layout.rowNames[a.moving[0].row] : undefined);
  const loc = a.unsettled[0]?.loc ?? locOfRow(circuit, firstNode?.endsWith(':base') ? firstNode.slice(0, -5) : firstNode);
  const suspects = [...a.unsettled.map((d) => d.name), ...a.unbalanced.map((u) => nodeLabel(u.name))];
  return {
    failed: true,
    errors: [error('op-no-convergence', loc,
      `The DC operating point did not converge${where}; tried ${tried.join(', then ')}.`,
      suspects.length > 0 ? `check the bias around ${listOf(suspects.slice(0, 4))}, or raise max_iter` : 'check the bias of the devices, or raise max_iter')],
  };
}

function error(code: DiagnosticCode, loc: SourceLoc, message: string, hint?: string): Diagnostic {
  return diagnostic('error', code, loc, message, hint);
}

function firstLoc(circuit: Circuit): SourceLoc {
  return circuit.parts[0]?.loc ?? { line: 1, col: 1 };
}

/** The location of the first part touching a node (or the part itself, for a branch row). */
function locOfRow(circuit: Circuit, name: string | undefined): SourceLoc {
  if (name !== undefined) {
    const base = name.endsWith(':base') ? name.slice(0, -5) : name;
    for (const p of circuit.parts) if (p.name === base || partNodes(p).includes(name)) return p.loc;
  }
  return firstLoc(circuit);
}

/** Rejects non-finite part values up front: they would poison every iterate. */
function findBadValue(circuit: Circuit): OpFailure | null {
  const t = circuit.options.temp;
  if (!Number.isFinite(t) || !(t > -273.15)) {
    return { failed: true, errors: [error('bad-temperature', { line: 1, col: 1 }, `The temperature ${t} °C is not above absolute zero, so the thermal voltage is undefined.`, 'set option temp to a temperature above −273.15 °C')] };
  }
  const finite = Number.isFinite;
  for (const p of circuit.parts) {
    // Written out rather than collected in an array: a sweep or a mismatch analysis checks every
    // part of every solve, and the arrays were a tenth of a mismatch run's garbage.
    let ok: boolean;
    switch (p.kind) {
      case 'res': case 'cap': case 'ind': ok = finite(p.value); break;
      case 'vsrc': case 'isrc': ok = finite(p.dc); break;
      case 'vcvs': ok = finite(p.gain); break;
      case 'vccs': ok = finite(p.gm); break;
      case 'npn': case 'pnp': {
        const m = p.model;
        ok = finite(p.area) && finite(m.is) && finite(m.beta) && finite(m.betaR) && finite(m.n) && finite(m.cje) && finite(m.cjc) && finite(m.tauf) && finite(m.eg) && finite(m.pt)
          && m.is > 0 && m.beta > 0 && m.betaR > 0 && m.n > 0 && p.area > 0;
        break;
      }
      case 'nmos': case 'pmos': {
        const m = p.model;
        ok = finite(p.w) && finite(p.l) && finite(p.m) && finite(m.ucox) && finite(m.vth) && finite(m.lambda) && finite(m.gamma) && finite(m.phi) && finite(m.cgs) && finite(m.cgd)
          && p.l > 0;
        break;
      }
      case 'diode': {
        const m = p.model;
        ok = finite(p.area) && finite(m.is) && finite(m.n) && finite(m.cj) && finite(m.eg) && finite(m.pt) && m.is > 0 && m.n > 0 && p.area > 0;
        break;
      }
    }
    if (!ok) return badValue(p.name, p.loc);
  }
  return null;
}

function badValue(name: string, loc: SourceLoc): OpFailure {
  return { failed: true, errors: [error('bad-value', loc, `${name} has a value the DC solver cannot use (not finite, or a zero/negative size, saturation current, gain or emission coefficient).`, 'check its value and model parameters')] };
}
