/**
 * The §5 result types, where the app and the tools have always imported them. They live in
 * solver/circuit/result.ts, beside the circuit types, so every stage can name them.
 */
export type * from './circuit/result';
