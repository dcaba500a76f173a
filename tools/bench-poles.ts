/**
 * The poles' part of `npm run bench`: "Poles time at 10, 30 and 100 nodes" — the poles (one LU
 * of G and one eigenvalue decomposition over the dynamic unknowns) and the zeros of adm (the
 * bordered pencil, the same work once more) on bench.ts's chains of bipolar differential stages
 * (junction capacitances, load capacitors), the ports on the inputs va, vb and the last stage's
 * collectors. A measurement, not a target; the analysis refuses circuits over MAX_POLES_UNKNOWNS.
 */
import type { PortsRequest } from '../solver/circuit/analyses';
import type { Circuit } from '../solver/circuit/types';
import { isOpFailure, solveOperatingPoint } from '../solver/analysis/operating-point';
import { circuitPoles, MAX_POLES_UNKNOWNS, portsTransfer, transferZeros } from '../solver/analysis/poles-zeros';
import { linearize } from '../solver/analysis/small-signal';
import { medianMs } from './timing';


/** One chain: the circuit and its last stage's two outputs. */
export interface PolesBenchCircuit {
  circuit: Circuit;
  outA: string;
  outB: string;
}

/** Prints "Poles time at 10, 30 and 100 nodes" (and any larger chain given, timed once). */
export function benchPoles(chains: readonly PolesBenchCircuit[]): void {
  console.log(`\nPoles time at 10, 30 and 100 nodes (median ms; the analysis takes at most ${MAX_POLES_UNKNOWNS} unknowns)`);
  console.log('  nodes  unknowns  poles  poles ms  zeros  zeros ms');
  for (const { circuit, outA, outB } of chains) {
    const op = solveOperatingPoint(circuit);
    if (isOpFailure(op)) throw new Error(op.errors.map((e) => e.message).join('; '));
    const system = linearize(circuit, op);
    if (system.size > MAX_POLES_UNKNOWNS) {
      console.log(`  ${String(circuit.nodes.length).padStart(5)}  ${String(system.size).padStart(8)}  over the cap`);
      continue;
    }
    const ports: PortsRequest = { inP: 'va', inN: 'vb', outP: outA, outN: outB, atHz: 0, loc: { line: 1, col: 1 } };
    const poles = circuitPoles(system);
    if (!poles.ok) throw new Error('singular G');
    const zeros = transferZeros(system, portsTransfer(system, ports), poles.poles);
    const runs = system.size > 200 ? 1 : 9;
    const polesMs = medianMs(() => circuitPoles(system), runs);
    const zerosMs = medianMs(() => transferZeros(system, portsTransfer(system, ports), poles.poles), runs);
    console.log(
      `  ${String(circuit.nodes.length).padStart(5)}  ${String(system.size).padStart(8)}  ${String(poles.poles.length).padStart(5)}  ${polesMs.toFixed(1).padStart(8)}` +
      `  ${String(zeros.ok ? zeros.zeros.length : '–').padStart(5)}  ${zerosMs.toFixed(1).padStart(8)}`,
    );
  }
}
