/**
 * Nodewright solver: the public API. Framework-free; runs in a Web Worker, in Node and in the CLI.
 *
 *   parseNetlist(text, { resolveUse })  → circuit, requests, diagnostics, symbols
 *   solveNetlist(text, { resolveUse })  → the §5 result object (never throws)
 *   solveWithOutline(text, { resolveUse }) → { result, outline }: the same result and, from the same
 *                                           parse, the outline the editor needs
 *   formatReport(result)                → the readable text report
 */
export { solveNetlist, solveWithOutline, solveCircuit, type SolveOptions, type CircuitRun, type OutlinedSolve } from './solve';
export type { NetlistOutline, OutlineSymbols, OutlineMeasure, OutlineCheck, OutlineUse } from './parse/outline';
export { parseNetlist } from './parse/parse-netlist';
export type * from './parse/parse-netlist';
export { readBlockDocs, type BlockDoc, type DocumentedPin, type DocumentedParam } from './parse/block-doc';
export { formatReport, CAUTION } from './report/text-report';
export { formatSi } from './report/si-format';
export { CMRR_CAP } from './analysis/ports';
export type * from './result';
export type * from './circuit/types';
export type * from './circuit/analyses';
export type { Diagnostic, Severity, SourceLoc } from './circuit/diagnostic';
export { GROUND, DEFAULT_OPTIONS } from './circuit/types';
