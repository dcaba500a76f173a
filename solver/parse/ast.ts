/**
 * The parsed (not yet elaborated) netlist: statements with their source positions. Values stay as
 * text until elaboration, because inside a block they depend on the instance's parameters.
 */
import type { SourceLoc } from '../circuit/diagnostic';
import type { CheckOp } from '../circuit/analyses';
import type { LogicalLine } from './lines';
import type { Token } from './tokens';

/** A name and where it was written. */
export interface Name {
  text: string;
  loc: SourceLoc;
}

/** The text of a value (quantity or expression) and where it stands, to place diagnostics. */
export interface ValueText {
  text: string;
  line: LogicalLine;
  /** Offset of `text` in the logical line. */
  start: number;
  loc: SourceLoc;
}

export interface KeyValue {
  key: Name;
  /** Absent when written `key=` with nothing after it (already reported). */
  value?: ValueText;
}

export interface ParamStmt { kind: 'param'; name: Name; value?: ValueText; loc: SourceLoc }
export interface OptionStmt { kind: 'option'; name: Name; value?: ValueText; loc: SourceLoc }
/** `broken`: the line's shape was wrong (reported); the name stands for a failed model, so its users stay quiet. */
export interface ModelStmt { kind: 'model'; name: Name; deviceKind: Name; keys: KeyValue[]; loc: SourceLoc; broken?: boolean }

/** One connection: `node` (positional) or `pin=node` (named). */
export interface Connection { pin?: Name; node: Name }

export interface PartStmt {
  kind: 'part';
  name: Name;
  partKind: Name;
  conns: Connection[];
  /** Location of the connection list, for pin-count diagnostics. */
  connsLoc: SourceLoc;
  /**
   * The connection list had a syntax error (already reported): the pins it fails to connect are
   * that one mistake, not a further "missing pin" each.
   */
  connsBroken?: 'syntax' | 'unclosed';
  main?: ValueText;
  keys: KeyValue[];
  loc: SourceLoc;
}

/** What a file or a block body defines. */
export interface Body {
  params: ParamStmt[];
  models: ModelStmt[];
  parts: PartStmt[];
  blocks: BlockDef[];
}

export interface BlockDef extends Body {
  kind: 'block';
  name: Name;
  pins: Name[];
  loc: SourceLoc;
  /** The file that defines the block (library blocks resolve their own models and blocks). */
  file: FileUnit;
  /** The enclosing block, for nested definitions. */
  parent?: BlockDef;
}

export interface UseStmt { kind: 'use'; path: string; version: number; blockName: string; loc: SourceLoc }

/** `analyze …` and `ports …`: kept as tokens and resolved once the circuit is known. */
export interface TokenStmt { kind: 'analyze' | 'ports'; line: LogicalLine; tokens: Token[]; loc: SourceLoc }
export interface MeasureStmt { kind: 'measure'; name: Name; expr?: ValueText; loc: SourceLoc }
export interface CheckStmt { kind: 'check'; text: string; lhs: ValueText; op: CheckOp; rhs: ValueText; tol?: ValueText; loc: SourceLoc }

export type RequestStmt = TokenStmt | MeasureStmt | CheckStmt;

/** One parsed file: the netlist itself or a library file brought in by `use`. */
export interface FileUnit extends Body {
  title?: string;
  options: OptionStmt[];
  uses: UseStmt[];
  requests: RequestStmt[];
  /** For library files: `path@version`, used to prefix their diagnostics. */
  origin?: string;
}

export function emptyBody(): Body {
  return { params: [], models: [], parts: [], blocks: [] };
}
