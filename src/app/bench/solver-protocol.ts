/**
 * Messages between the bench and its solver worker. Plain data only (structured clone).
 */
import type { SolveResult } from '../../../solver';

/** What the editor completes from: the names a netlist defines, as the parser saw them. */
export interface NetlistNames {
  /** Model names with their device kind (`npn`, `nmos`, …). */
  models: { name: string; kind: string }[];
  /** Blocks defined in the file (and used from the library) with their pins and params. */
  blocks: { name: string; pins: string[]; params: string[] }[];
  /** Top-level parameters. */
  params: string[];
  /** Part names with their kind. */
  parts: { name: string; kind: string }[];
  /** Node names. */
  nodes: string[];
  /** Measure names. */
  measures: string[];
}

export const NO_NAMES: NetlistNames = { models: [], blocks: [], params: [], parts: [], nodes: [], measures: [] };

/** Bench → worker. */
export interface SolveRequest {
  type: 'solve';
  /**
   * Increases with every request; a reply answers the request of the same id. A request still
   * waiting when a newer one arrives is superseded and gets no reply.
   */
  id: number;
  text: string;
}

/** Worker → bench. */
export interface SolveReply {
  type: 'solved';
  id: number;
  result: SolveResult;
  /** The text solved (echoed, so a panel can read measure lines from the very text of its result). */
  text: string;
  names: NetlistNames;
  /** Wall time of the solve inside the worker, ms (the bench's guess of how long the next will take). */
  solveMs: number;
}

/** Worker → bench, once its module has loaded. */
export interface ReadyMessage {
  type: 'ready';
}

export type WorkerMessage = SolveReply | ReadyMessage;
