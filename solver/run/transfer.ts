/**
 * `analyze transfer`: the DC transfer curve, one independent source's DC value stepped from the
 * start to the end value (warm-started from the operating point). The result member is
 * `transfer`: `v(n)` of every top-level node and `i(p)` of every two-terminal part and source.
 */
import type { TransferRequest } from '../circuit/analyses';
import type { Part } from '../circuit/types';
import type { TransferResult } from '../circuit/result';
import { dcSweep } from '../analysis/dc-sweep';
import { topLevelNodes, type AnalysisRunner } from './analysis-run';

/**
 * Sweep values from `from` to `to` by `step`, both ends included (the last clipped to `to`). The
 * request was checked where it was resolved: a non-zero step that leads from `from` to `to`.
 */
export function transferValues(req: Pick<TransferRequest, 'from' | 'to' | 'step'>): number[] {
  const { from, to, step } = req;
  const count = Math.floor(Math.abs((to - from) / step) * (1 + 1e-12)) + 1;
  const values = Array.from({ length: count }, (_, k) => from + k * step);
  if (Math.abs(values[count - 1] - to) > Math.abs(step) * 1e-9) values.push(to);
  else values[count - 1] = to;
  return values;
}

function isTwoTerminal(p: Part): boolean {
  return p.kind === 'res' || p.kind === 'cap' || p.kind === 'ind' || p.kind === 'vsrc' || p.kind === 'isrc';
}

/** Runs the transfer sweep of a resolved request. */
export const runTransfer: AnalysisRunner<'transfer', TransferResult> = (circuit, bias, request) => {
  const sweep = dcSweep(circuit, request.source, transferValues(request), bias.op);
  const curves: Record<string, number[]> = {};
  for (const n of topLevelNodes(circuit)) curves[`v(${n})`] = sweep.points.map((pt) => pt.nodes[n] ?? 0);
  for (const p of circuit.parts.filter(isTwoTerminal)) {
    curves[`i(${p.name})`] = sweep.points.map((pt) => (pt.parts[p.name] ?? pt.sources[p.name])?.i ?? 0);
  }
  return { member: { source: request.source, x: sweep.x, curves }, diagnostics: sweep.errors };
};
