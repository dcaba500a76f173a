/**
 * DC transfer sweep (`analyze transfer`): one independent source's DC value stepped over a list
 * of values, each point warm-started from the previous converged point; a point that fails warm
 * falls back to the full operating-point ladder (cold Newton, gmin stepping, source stepping).
 */
import { diagnostic, type Diagnostic } from '../circuit/diagnostic';
import type { Circuit, CurrentSource, Part, VoltageSource } from '../circuit/types';
import type { DcSweepResult, OperatingPoint } from './engine-api';
import { borrowWorkspace, releaseWorkspace } from './newton';
import { isOpFailure, solveWithWorkspace } from './operating-point';

/**
 * Sweeps `source` (a vsrc or isrc name) over `values`. `start` (an operating point of the same
 * circuit) warm-starts the first point. Failed points are left out of `x`/`points` and reported
 * in `errors`. The source is checked where the `analyze transfer` line is resolved; a name that
 * is not an independent source here is a defect of the caller and throws.
 */
export function dcSweep(circuit: Circuit, source: string, values: readonly number[], start?: OperatingPoint): DcSweepResult {
  const result: DcSweepResult = { x: [], points: [], errors: [] };
  const index = circuit.parts.findIndex((p) => p.name === source);
  const original = circuit.parts[index];
  if (!original || (original.kind !== 'vsrc' && original.kind !== 'isrc')) {
    throw new Error(`dcSweep: \`${source}\` is not an independent source of the circuit`);
  }
  // A private copy of the swept source, mutated per point; every other part is shared.
  const swept: VoltageSource | CurrentSource = { ...original };
  const parts: Part[] = circuit.parts.slice();
  parts[index] = swept;
  const sweptCircuit: Circuit = { ...circuit, parts };
  const ws = borrowWorkspace(sweptCircuit);
  let previous: Float64Array | undefined = start && start.x.length === ws.n ? start.x : undefined;
  for (const value of values) {
    if (!Number.isFinite(value)) {
      result.errors.push(pointError(original.loc, source, value, 'the value is not finite'));
      continue;
    }
    swept.dc = value;
    const op = solveWithWorkspace(ws, previous ? { x: previous } : undefined);
    if (isOpFailure(op)) {
      const why = op.errors[0]?.message ?? 'no convergence';
      result.errors.push(pointError(original.loc, source, value, why));
      continue;
    }
    previous = op.x;
    result.x.push(value);
    result.points.push(op.report);
  }
  releaseWorkspace(ws);
  return result;
}

function pointError(loc: { line: number; col: number }, source: string, value: number, why: string): Diagnostic {
  return diagnostic('error', 'transfer-point', { line: loc.line, col: loc.col }, `The transfer point ${source} = ${Number.isFinite(value) ? value : String(value)} was not solved: ${why}`);
}
