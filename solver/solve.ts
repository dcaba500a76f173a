/**
 * solveNetlist and solveCircuit, where callers have always found them. The orchestration lives
 * in solver/run/: solve-netlist.ts (text → result), solve-circuit.ts (one run over a circuit),
 * analyses.ts (the analyses by kind) and one file per analysis.
 */
export { solveNetlist, solveWithOutline, type OutlinedSolve, type SolveOptions } from './run/solve-netlist';
export { solveCircuit, type CircuitRun } from './run/solve-circuit';
export { MAX_AC_POINTS, MAX_TRANSFER_POINTS } from './parse/analyze-syntax';
