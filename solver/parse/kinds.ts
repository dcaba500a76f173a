/**
 * The tables of §2, where the parser (and the editor) has always found them; they live in
 * solver/language/ with the rest of the vocabulary.
 */
export * from '../language/part-kinds';
export { KEYWORDS, BUILTIN_FIGURES } from '../language/vocabulary';
