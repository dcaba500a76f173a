/**
 * The netlist parser and elaborator (netlist-language.md §1–§4, static diagnostics).
 */
export { parseNetlist, type NetlistSymbols, type ParseOptions, type ParseResult, type UseLookup } from './parse-netlist';
export { parseQuantity, type QuantityResult, type QuantityUnit } from './quantity';
export { rewriteExpression, rewriteExpressionDetailed, evaluateExpression, RESULT_FUNCTIONS } from './expression';
export { closest, didYouMean, levenshtein } from './suggest';
