/**
 * Nodewright solver: the public API. Framework-free; runs in a Web Worker, in Node and in the CLI.
 *
 *   parseNetlist(text, { resolveUse })  → circuit, requests, diagnostics, symbols
 *   solveNetlist(text, { resolveUse })  → the §5 result object (never throws)
 *   formatReport(result)                → the readable text report
 */
export { solveNetlist, solveCircuit, type SolveOptions, type CircuitRun } from './solve';
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
