/**
 * Messages between the bench and its solver worker. Plain data only (structured clone).
 */
import type { BlockDoc, NetlistOutline, OutlineSymbols, SolveResult } from '../../../solver';

/** Where a `use`d block's source came from. */
export type BlockOrigin =
  /** The signed-in workspace's library, through the API. */
  | 'workspace'
  /** The seed library shipped with the app (`library/`). */
  | 'seed'
  /** The IndexedDB copy kept from an earlier fetch (the server could not be asked). */
  | 'cache'
  /** The source pinned in the share link being read. */
  | 'share';

/** Library states of a block version (the server's vocabulary). */
export type UsedBlockState = 'draft' | 'in_review' | 'vetted' | 'retired';

/** One `use path@version` line of the solved text, as the worker resolved it. */
export interface UsedBlock {
  /** 1-based line of the `use` statement in the solved text (0 when it came through another block file). */
  line: number;
  path: string;
  version: number;
  /** Where the source came from; absent when it could not be resolved (the solver reports why). */
  origin?: BlockOrigin;
  /** The version's state in its library (seed blocks are vetted). */
  state?: UsedBlockState;
  /** The newest vetted version of the block, when known: a newer one than `version` is worth a warning. */
  newestVetted?: number | null;
  /** The doc comments and headers of the blocks the file defines (pins and params with their docs). */
  docs: BlockDoc[];
}

/** What the editor completes `use` lines from: the library's blocks and their versions. */
export interface LibraryEntry {
  path: string;
  title: string;
  summary: string;
  /** Versions a netlist may pin, newest first, with their states. */
  versions: { version: number; state: UsedBlockState }[];
  origin: 'workspace' | 'seed';
}

/**
 * What the editor completes from: the names a netlist defines as the solver's parse understood
 * them (the outline's symbols: models and parts with their kinds, parts of block instances
 * included), and the text's `use` lines as the worker resolved them, in text order.
 */
export type NetlistNames = OutlineSymbols & { uses: UsedBlock[] };

export const NO_NAMES: NetlistNames = { models: [], blocks: [], params: [], parts: [], nodes: [], measures: [], uses: [] };

/** The text's measure, check and analyze lines (line, name, expression as written), from the parse that gave the result. */
export type RequestLines = Pick<NetlistOutline, 'measures' | 'checks' | 'analyses'>;

export const NO_LINES: RequestLines = { measures: [], checks: [], analyses: [] };

/** A block version's source pinned by a share link. */
export interface PinnedBlock {
  path: string;
  version: number;
  source: string;
}

/** Where `use` lines resolve from (see library-resolver.ts). */
export interface LibraryContext {
  /** The signed-in workspace's slug: its library is asked first. */
  workspace?: string;
  /** Sources pinned by the share link being read: they win over everything else. */
  pinned?: PinnedBlock[];
}

/**
 * An `analyze mismatch` line of the solved text. The live solve leaves it out (it would hold up
 * the results for seconds); the Mismatch tab runs it over a pool of workers when asked.
 */
export interface MismatchAsk {
  /** 1-based line of the `analyze mismatch` statement. */
  line: number;
  runs: number;
  seed: number;
  /** Spreads by key: relative (0.05 for 5 %), `vth` in volts. */
  sigmas: Record<string, number>;
  /** Where the text's `use` lines resolved from: the pool's workers resolve them the same way. */
  library: LibraryContext;
}

/** Bench → worker. */
export interface SolveRequest {
  type: 'solve';
  /**
   * Increases with every request; a reply answers the request of the same id. A request still
   * waiting when a newer one arrives is superseded and gets no reply.
   */
  id: number;
  text: string;
  /** Where its `use` lines resolve from; none: the seed library only. */
  library?: LibraryContext;
}

/** Worker → bench. */
export interface SolveReply {
  type: 'solved';
  id: number;
  result: SolveResult;
  /** The text solved, echoed with its result. */
  text: string;
  names: NetlistNames;
  /** The measure and check lines of that text, from the same parse: the panels show them beside the result. */
  lines: RequestLines;
  /** Wall time of the solve inside the worker, ms (the bench's guess of how long the next will take). */
  solveMs: number;
  /** The text's `analyze mismatch`, left out of this solve, when its circuit solved. */
  mismatch?: MismatchAsk;
  /**
   * The analyses that re-solve the circuit many times (`vary`, `temp`, `sensitivity`) are still
   * to come, in a `completed` message for the same id — unless newer text arrives first: the
   * worker runs them in slices of STEP_SLICE_MS and drops them at a slice's end for newer text.
   */
  pending?: boolean;
  /**
   * Set by the client when the second stage completed: the whole result (`result` plus the
   * sweeps and sensitivity and their diagnostics). `result` itself is kept, so the panels that
   * read only it are not redrawn when the sweeps arrive.
   */
  whole?: SolveResult;
}

/**
 * The second stage runs in slices of this many ms (plus the step under way: a sweep value, a
 * sensitivity knob); between slices the worker takes in new requests and drops the stage for one.
 */
export const STEP_SLICE_MS = 8;

/** Worker → bench: the whole result of a reply that was `pending`. */
export interface CompletedMessage {
  type: 'completed';
  id: number;
  result: SolveResult;
  /** Wall time of the second stage, ms. */
  solveMs: number;
}

/** Worker → bench: the second stage of a `pending` reply was dropped for newer text, which the worker has turned to. */
export interface DroppedMessage {
  type: 'dropped';
  id: number;
}

/** Worker → bench, once its module has loaded. */
export interface ReadyMessage {
  type: 'ready';
}

export type WorkerMessage = SolveReply | CompletedMessage | DroppedMessage | ReadyMessage;
