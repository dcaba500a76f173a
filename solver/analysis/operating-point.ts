/**
 * The DC operating point: Newton–Raphson with junction limiting, then gmin stepping, then
 * source stepping, each bounded; a clean OpFailure naming the worst nodes when all fail.
 *
 * gmin stepping (a conductance from every node to ground, started large and lowered a decade at
 * a time, each solve warm-started from the last) and source stepping (all independent sources
 * ramped from 0 to 100 %) are the standard continuation methods for hard DC problems.
 */
import type { Diagnostic, SourceLoc } from '../circuit/diagnostic';
import type { Circuit } from '../circuit/types';
import type { OperatingPoint, OpFailure } from './engine-api';
import { buildLayout, partNodes, type MnaLayout } from './mna';
import { NewtonWorkspace, runNewton } from './newton';
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
  worst: { row: number; update: number; residual: number }[];
  singularRow: number;
}

/** Solves the DC operating point of `circuit`. Never throws. */
export function solveOperatingPoint(circuit: Circuit, start?: OpStart): OperatingPoint | OpFailure {
  const layout = buildLayout(circuit);
  const ws = new NewtonWorkspace(circuit, layout);
  return solveWithWorkspace(ws, start);
}

/** Type guard for the failure branch. */
export function isOpFailure(r: OperatingPoint | OpFailure): r is OpFailure {
  return (r as OpFailure).failed === true;
}

/** The strategy ladder on a prepared workspace (reused by DC sweeps). */
export function solveWithWorkspace(ws: NewtonWorkspace, start?: OpStart): OperatingPoint | OpFailure {
  const { circuit, layout, n } = ws;
  const bad = findBadValue(circuit);
  if (bad) return bad;
  const { minG, maxIter } = circuit.options;
  const iterLimit = Math.max(1, Math.min(Math.floor(Number.isFinite(maxIter) ? maxIter : 200), 100000));
  const gminFinal = Number.isFinite(minG) && minG > 0 ? minG : 0;
  const x = new Float64Array(n);
  let total = 0;
  const attempts: Attempts = { newtonIterations: 0, worst: [], singularRow: -1 };
  const budget = Math.min(TOTAL_ITER_BUDGET, 20 * iterLimit + 1000);
  const stepLimit = Math.min(iterLimit, STEP_ITER_LIMIT);
  /** One bounded Newton run; out of budget counts as not converged. */
  const newton = (limit: number) => {
    const result = runNewton(ws, x, Math.max(0, Math.min(limit, budget - total)));
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
  let out = newton(iterLimit);
  attempts.newtonIterations = out.iterations;
  attempts.singularRow = out.singularRow;
  attempts.worst = worstRows(ws);
  if (out.converged) return success(ws, x, 'newton', total);

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
    if (ok) return success(ws, x, 'gmin-stepping', total);
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
        if (reached >= 1) return success(ws, x, 'source-stepping', total);
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

/** Builds the OperatingPoint from a converged x (checked finite). */
function success(ws: NewtonWorkspace, x: Float64Array, method: string, iterations: number): OperatingPoint | OpFailure {
  const { report, warnings } = buildOpReport(ws.circuit, ws.layout, ws.devices, x);
  if (!reportIsFinite(report)) {
    return { failed: true, errors: [error('op-non-finite', firstLoc(ws.circuit), 'The DC operating point produced a non-finite value.', 'check for extreme part values')] };
  }
  return {
    circuit: ws.circuit,
    x: Float64Array.from(x),
    nodeIndex: ws.layout.nodeIndex,
    branchIndex: ws.layout.branchIndex,
    report,
    warnings,
    method,
    iterations,
  };
}

/** The rows with the largest voltage update, with their residuals, from the last Newton iterate. */
function worstRows(ws: NewtonWorkspace): Attempts['worst'] {
  const rows: Attempts['worst'] = [];
  for (let i = 0; i < ws.layout.voltageCount; i++) {
    const update = ws.update[i];
    const residual = ws.residual[i];
    if (Number.isFinite(update) || Number.isFinite(residual)) rows.push({ row: i, update, residual });
  }
  const weight = (r: Attempts['worst'][number]) => Math.abs(r.update) + Math.abs(r.residual) * 1e3;
  rows.sort((a, b) => weight(b) - weight(a));
  return rows.slice(0, 3);
}

function failure(ws: NewtonWorkspace, layout: MnaLayout, a: Attempts, iterLimit: number, gminFinal: number): OpFailure {
  const circuit = ws.circuit;
  if (a.singularRow >= 0) {
    const label = layout.rowLabels[a.singularRow] ?? `row ${a.singularRow}`;
    const name = layout.rowNames[a.singularRow];
    return {
      failed: true,
      errors: [error('op-singular', locOfRow(circuit, name), `The DC system cannot be solved at ${label}: it has no DC path to ground or sits in a loop of voltage sources or inductors.`,
        'give every node a DC path to ground and break loops of voltage sources')],
    };
  }
  const fmt = (v: number) => (Number.isFinite(v) ? v.toPrecision(3) : 'non-finite');
  const worst = a.worst.map((w) => `${layout.rowNames[w.row]} (last step ${fmt(w.update)} V, residual ${fmt(w.residual)} A)`);
  const tried = [
    `Newton–Raphson (${a.newtonIterations} of ${iterLimit} iterations)`,
    `gmin stepping from ${GMIN_START} S to ${gminFinal} S${a.gminReached !== undefined ? ` (converged down to ${a.gminReached.toPrecision(2)} S)` : ' (no step converged)'}`,
    `source stepping 0 → 100 %${a.sourceReached !== undefined ? ` (reached ${(a.sourceReached * 100).toFixed(1)} %)` : ' (no step converged)'}`,
  ];
  const worstNames = a.worst.map((w) => layout.rowNames[w.row]);
  return {
    failed: true,
    errors: [error('op-no-convergence', locOfRow(circuit, worstNames[0]),
      `The DC operating point did not converge; worst nodes: ${worst.join(', ') || 'none'}. Tried ${tried.join(', then ')}.`,
      'check the bias of the devices at those nodes, or raise max_iter')],
  };
}

function error(code: string, loc: SourceLoc, message: string, hint?: string): Diagnostic {
  return { severity: 'error', code, line: loc.line, col: loc.col, endCol: loc.endCol, message, ...(hint ? { hint } : {}) };
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
  for (const p of circuit.parts) {
    const values: number[] = [];
    switch (p.kind) {
      case 'res': case 'cap': case 'ind': values.push(p.value); break;
      case 'vsrc': case 'isrc': values.push(p.dc); break;
      case 'vcvs': values.push(p.gain); break;
      case 'vccs': values.push(p.gm); break;
      case 'npn': case 'pnp': {
        const m = p.model;
        values.push(p.area, m.is, m.beta, m.betaR, m.n, m.cje, m.cjc, m.tauf, m.eg, m.pt);
        if (!(m.is > 0 && m.beta > 0 && m.betaR > 0 && m.n > 0 && p.area > 0)) return badValue(p.name, p.loc);
        break;
      }
      case 'nmos': case 'pmos': {
        const m = p.model;
        values.push(p.w, p.l, p.m, m.ucox, m.vth, m.lambda, m.gamma, m.phi, m.cgs, m.cgd);
        if (!(p.l > 0)) return badValue(p.name, p.loc);
        break;
      }
      case 'diode':
        values.push(p.area, p.model.is, p.model.n, p.model.cj, p.model.eg, p.model.pt);
        if (!(p.model.is > 0 && p.model.n > 0 && p.area > 0)) return badValue(p.name, p.loc);
        break;
    }
    if (values.some((v) => !Number.isFinite(v))) return badValue(p.name, p.loc);
  }
  return null;
}

function badValue(name: string, loc: SourceLoc): OpFailure {
  return { failed: true, errors: [error('bad-value', loc, `${name} has a value the DC solver cannot use (not finite, or a zero/negative size, saturation current, gain or emission coefficient).`, 'check its value and model parameters')] };
}
