/**
 * The netlist parser (netlist-language.md §1–§4, static diagnostics). parseNetlist itself, which
 * also elaborates, is in solver/elaborate/parse-netlist.ts (and the solver's index); its types are here.
 */
export type { NetlistSymbols, ParseOptions, ParseResult, UseLookup } from './parse-netlist';
export { parseQuantity, type QuantityResult, type QuantityUnit } from './quantity';
export { rewriteExpression, rewriteExpressionDetailed, evaluateExpression, RESULT_FUNCTIONS } from './expression';
export { closest, didYouMean, levenshtein } from './suggest';
