/**
 * What the netlist asks for beyond the DC operating point: analyses, ports, measures, checks.
 * Produced by the parser (numbers evaluated, names resolved to flattened names); consumed by
 * `solver/index.ts`, which runs them in order and composes the result.
 */
import type { SourceLoc } from './diagnostic';

/** `analyze ac from F1 to F2 per decade N`. */
export interface AcRequest { kind: 'ac'; fromHz: number; toHz: number; perDecade: number; loc: SourceLoc }

/** `analyze transfer SRC from X1 to X2 step DX`: DC sweep of one source's DC value. */
export interface TransferRequest { kind: 'transfer'; source: string; from: number; to: number; step: number; loc: SourceLoc }

/** `analyze vary PARAM over v1 v2 …` or `from … to … per decade N` (later issue). */
export interface VaryRequest { kind: 'vary'; param: string; values: number[]; loc: SourceLoc }

/** `analyze temp over t1 t2 …` in °C (later issue). */
export interface TempRequest { kind: 'temp'; valuesC: number[]; loc: SourceLoc }

/** `analyze noise out NODE in SOURCE from F1 to F2 per decade N` (later issue). */
export interface NoiseRequest { kind: 'noise'; out: string; outRef?: string; input: string; fromHz: number; toHz: number; perDecade: number; loc: SourceLoc }

/** `analyze mismatch runs N seed S beta 5% is 2% res 0.5% …` (later issue); sigmas are fractions. */
export interface MismatchRequest { kind: 'mismatch'; runs: number; seed: number; sigmas: Record<string, number>; loc: SourceLoc }

/** `analyze sensitivity`: (∂F/F)/(∂x/x) of every figure to every part value and device parameter. */
export interface SensitivityRequest { kind: 'sensitivity'; loc: SourceLoc }

/**
 * `analyze poles [out NODE]`: the poles of the linearised circuit, and the zeros of the ports'
 * adm or, without ports, of the transfer from the first source with an `ac=` to `out`.
 */
export interface PolesRequest { kind: 'poles'; out?: string; loc: SourceLoc }

export type AnalysisRequest = AcRequest | TransferRequest | VaryRequest | TempRequest | NoiseRequest | MismatchRequest | SensitivityRequest | PolesRequest;

/** `ports in=(va, vb) out=(outa, outb) [at F]`; `outN` absent for a single-ended output. */
export interface PortsRequest {
  inP: string;
  inN: string;
  outP: string;
  outN?: string;
  atHz: number;
  loc: SourceLoc;
}

/**
 * `measure NAME = EXPR`. `expr` is mathjs syntax after quantity rewriting (`4.7k` → `4700`) and
 * with name arguments of the result functions quoted (`ic(m1.qa)` → `ic("m1.qa")`).
 */
export interface MeasureRequest { name: string; expr: string; source: string; loc: SourceLoc }

export type CheckOp = '>=' | '<=' | '>' | '<' | '=';

/**
 * `check LHS OP RHS [± TOL]`. Expressions as in MeasureRequest. `tol` is absolute unless
 * `tolRelative` (written with `%`, stored as a fraction).
 */
export interface CheckRequest {
  text: string;
  lhs: string;
  op: CheckOp;
  rhs: string;
  tol?: number;
  tolRelative?: boolean;
  loc: SourceLoc;
}

/** Everything a netlist asks of the solver besides its circuit. */
export interface Requests {
  analyses: AnalysisRequest[];
  ports?: PortsRequest;
  measures: MeasureRequest[];
  checks: CheckRequest[];
  /** `param` values after evaluation, for measures that use them. */
  params: Record<string, number>;
  /**
   * Requests that were written but could not be used, already reported (`'ac'`, `'ports'`, …):
   * a measure that needs one of them fails silently instead of saying it is missing.
   */
  failed?: string[];
}
