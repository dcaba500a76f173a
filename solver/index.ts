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
export type { NetlistOutline, OutlineSymbols, OutlineMeasure, OutlineCheck, OutlineUse, OutlineAnalysis } from './parse/outline';
export { parseNetlist } from './elaborate/parse-netlist';
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
// The language's vocabulary tables and the readers the bench's editor and panels share with the parser.
export {
  STATEMENTS, ANALYSIS_SPECS, FUNCTIONS, FIGURES, DEVICE_FIELDS, PIN_DOCS, MISMATCH_KEYS, functionSpec, takesNames,
  type StatementSpec, type AnalysisSpec, type AnalysisKind, type FunctionSpec, type ArgumentKind, type FigureSpec, type QuantitySpec, type QuantityUnit,
} from './language/vocabulary';
export { PART_KINDS, MODEL_KEYS, MODEL_KINDS, OPTION_KEYS, modelFamily, type PartKindSpec, type ModelFamily } from './language/part-kinds';
export { tokenize, type Token } from './parse/tokens';
export { parseQuantity } from './parse/quantity';
export { INFINITE_OHMS } from './report/si-format';
export { corner, unity, CORNER_DB } from './measure/curve';
// The noise band rule (power law between grid points) the report and the noise measures share.
export { bandPower, powerAt } from './report/noise-band';
// Mismatch runs by range and their summary: the bench spreads the runs over several workers.
export { mismatchSamples, summarizeMismatch, perturbedCircuit, MAX_MISMATCH_WORK, type MismatchSample } from './run/mismatch';
export type { SampleStats } from './numeric/stats';
export type { Steps } from './run/steps';
