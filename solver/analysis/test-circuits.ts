/**
 * A tiny builder of flattened circuits for the engine's tests and the bench: parts written as
 * plain objects, nodes collected in first-appearance order, default models filled in.
 */
import type { SourceLoc } from '../circuit/diagnostic';
import { DEFAULT_OPTIONS, GROUND, partNodes, type BjtModel, type Circuit, type DiodeModel, type MosModel, type Part, type SolverOptions } from '../circuit/types';

/** The netlist language's built-in default bipolar model (va = ∞, no capacitances). */
export function bjtModel(overrides: Partial<BjtModel> = {}): BjtModel {
  return { name: 'q', is: 1e-16, beta: 100, betaR: 1, va: Infinity, n: 1, rb: 0, cje: 0, cjc: 0, tauf: 0, eg: 1.12, pt: 3, ...overrides };
}

/** The built-in default MOS model (ucox = 100 µA/V², vth = 0.5 V, λ = 0). */
export function mosModel(overrides: Partial<MosModel> = {}): MosModel {
  return { name: 'm', ucox: 100e-6, vth: 0.5, lambda: 0, gamma: 0, phi: 0.7, cgs: 0, cgd: 0, ...overrides };
}

/** The built-in default diode model (is = 1e-14 A, n = 1). */
export function diodeModel(overrides: Partial<DiodeModel> = {}): DiodeModel {
  return { name: 'd', is: 1e-14, n: 1, cj: 0, eg: 1.12, pt: 3, ...overrides };
}

type WithoutLoc<T> = T extends Part ? Omit<T, 'loc'> & { loc?: SourceLoc } : never;
/** A part as written in a test: `loc` optional. */
export type PartSpec = WithoutLoc<Part>;

/** Builds a Circuit from part specs; each part gets line = its position + 1. */
export function circuitOf(parts: PartSpec[], options: Partial<SolverOptions> = {}, title = 'test'): Circuit {
  const full: Part[] = parts.map((p, i) => ({ ...p, loc: p.loc ?? { line: i + 1, col: 1 } }) as Part);
  const nodes: string[] = [];
  const seen = new Set<string>([GROUND]);
  for (const p of full) for (const n of partNodes(p)) if (!seen.has(n)) { seen.add(n); nodes.push(n); }
  return { title, nodes, parts: full, options: { ...DEFAULT_OPTIONS, ...options } };
}
