/**
 * The elaborated circuit: what the parser and elaborator hand to the analyses.
 *
 * Every block instance is flattened (names dotted: `m1.qa`), every expression evaluated to a
 * plain number in SI base units, every model resolved to its full parameter set. The analyses
 * never see source text, only this structure (plus `loc` to point diagnostics back at a line).
 */
import type { SourceLoc } from './diagnostic';

/** The reference node; always 0 V. */
export const GROUND = 'gnd';

/** Small-signal excitation of an independent source: magnitude and phase in degrees. */
export interface AcSpec {
  mag: number;
  phaseDeg: number;
}

interface PartBase {
  /** Flattened, dotted name, unique in the circuit. */
  name: string;
  loc: SourceLoc;
}

export interface Resistor extends PartBase { kind: 'res'; a: string; b: string; value: number }
export interface Capacitor extends PartBase { kind: 'cap'; a: string; b: string; value: number }
export interface Inductor extends PartBase { kind: 'ind'; a: string; b: string; value: number }
/** v(p) − v(n) = dc. Its current is reported in the p→n sense through the source (§5 `i`). */
export interface VoltageSource extends PartBase { kind: 'vsrc'; p: string; n: string; dc: number; ac?: AcSpec }
/** dc amperes flow from `from` through the source into `to`. */
export interface CurrentSource extends PartBase { kind: 'isrc'; from: string; to: string; dc: number; ac?: AcSpec }
/** v(p, n) = gain · v(cp, cn). */
export interface Vcvs extends PartBase { kind: 'vcvs'; p: string; n: string; cp: string; cn: string; gain: number }
/** gm · v(cp, cn) flows from `from` through the source into `to`. */
export interface Vccs extends PartBase { kind: 'vccs'; from: string; to: string; cp: string; cn: string; gm: number }

/** Bipolar model parameters, SI units; `va` is Infinity when absent. */
export interface BjtModel {
  name: string;
  is: number;
  beta: number;
  betaR: number;
  va: number;
  n: number;
  rb: number;
  cje: number;
  cjc: number;
  tauf: number;
  /** Band gap in eV for IS(T). */
  eg: number;
  /** Temperature exponent for IS(T). */
  pt: number;
  /**
   * Flicker (1/f) noise corner in Hz (model key `flicker_corner`): the 1/f part of the device's
   * noise equals its white part at this frequency. Absent or 0: no flicker noise.
   */
  flickerCorner?: number;
}

export interface Bjt extends PartBase {
  kind: 'npn' | 'pnp';
  c: string;
  b: string;
  e: string;
  model: BjtModel;
  /** Emitter-area multiplier: scales IS and the capacitances. */
  area: number;
}

/**
 * MOS square-law model. `vth` is the magnitude for pmos. `cgs`/`cgd` are absolute farads per
 * device (multiplied by `m`), not per unit area: a reviewer reads the number they wrote.
 */
export interface MosModel {
  name: string;
  ucox: number;
  vth: number;
  lambda: number;
  /** Body-effect coefficient γ in √V; 0 disables the body effect. */
  gamma: number;
  /** Surface potential 2φF in V. */
  phi: number;
  cgs: number;
  cgd: number;
  /**
   * Flicker (1/f) noise corner in Hz (model key `flicker_corner`): the 1/f part of the device's
   * noise equals its white part at this frequency. Absent or 0: no flicker noise.
   */
  flickerCorner?: number;
}

export interface Mosfet extends PartBase {
  kind: 'nmos' | 'pmos';
  d: string;
  g: string;
  s: string;
  b: string;
  model: MosModel;
  w: number;
  l: number;
  /** Parallel multiplier. */
  m: number;
}

export interface DiodeModel {
  name: string;
  is: number;
  n: number;
  cj: number;
  eg: number;
  pt: number;
  /**
   * Flicker (1/f) noise corner in Hz (model key `flicker_corner`): the 1/f part of the device's
   * noise equals its white part at this frequency. Absent or 0: no flicker noise.
   */
  flickerCorner?: number;
}

export interface Diode extends PartBase { kind: 'diode'; a: string; k: string; model: DiodeModel; area: number }

export type Part = Resistor | Capacitor | Inductor | VoltageSource | CurrentSource | Vcvs | Vccs | Bjt | Mosfet | Diode;
export type PartKind = Part['kind'];
export type TwoTerminal = Resistor | Capacitor | Inductor | VoltageSource | CurrentSource;
export type Device = Bjt | Mosfet | Diode;

/** Solver options (`option` statements), with defaults applied. */
export interface SolverOptions {
  /** Temperature in °C (default 27). */
  temp: number;
  /** Relative tolerance of the Newton iteration (default 1e-9). */
  relTol: number;
  /** Absolute voltage tolerance in V (default 1e-12). */
  absTol: number;
  /** Conductance from every node to ground in S (default 1e-12). */
  minG: number;
  /** Newton iteration limit per attempt (default 200). */
  maxIter: number;
}

export const DEFAULT_OPTIONS: SolverOptions = { temp: 27, relTol: 1e-9, absTol: 1e-12, minG: 1e-12, maxIter: 200 };

/** A flattened circuit ready for analysis. */
export interface Circuit {
  title: string;
  /** All node names except `gnd`, in first-appearance order (top-level nodes have no dot). */
  nodes: string[];
  parts: Part[];
  options: SolverOptions;
}

/**
 * The nodes a part connects to, in its canonical pin order: the order in which the elaborator
 * meets a part's nodes (first appearance) and the order the engine numbers them in.
 */
export function partNodes(p: Part): string[] {
  switch (p.kind) {
    case 'res': case 'cap': case 'ind': return [p.a, p.b];
    case 'vsrc': return [p.p, p.n];
    case 'isrc': return [p.from, p.to];
    case 'vcvs': return [p.p, p.n, p.cp, p.cn];
    case 'vccs': return [p.from, p.to, p.cp, p.cn];
    case 'npn': case 'pnp': return [p.c, p.b, p.e];
    case 'nmos': case 'pmos': return [p.d, p.g, p.s, p.b];
    case 'diode': return [p.a, p.k];
  }
}
