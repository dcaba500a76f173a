/**
 * Messages between the Mismatch tab's pool and its workers. Plain data only (structured clone).
 */
import type { MismatchSample } from '../../../../solver';
import type { LibraryContext } from '../solver-protocol';

/** Pool → worker: solve runs `from` (inclusive) to `to` (exclusive) of the text's `analyze mismatch`. */
export interface ChunkRequest {
  type: 'chunk';
  /** The pool's job number: replies of a cancelled or finished job are ignored. */
  job: number;
  text: string;
  /** Where the text's `use` lines resolve from (the solver worker's context for the same text). */
  library: LibraryContext;
  from: number;
  to: number;
}

/** Worker → pool: the samples of one chunk. */
export interface ChunkSamples {
  type: 'samples';
  job: number;
  from: number;
  to: number;
  samples: MismatchSample[];
}

/** Worker → pool: the text cannot be run (it no longer parses, has no mismatch line, or asks too much). */
export interface ChunkRefused {
  type: 'refused';
  job: number;
  message: string;
}

export type ChunkReply = ChunkSamples | ChunkRefused;
