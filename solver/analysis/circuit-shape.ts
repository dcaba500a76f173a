/**
 * A circuit's shape: the layout of its unknowns and its sparse MNA pattern, which depend on its
 * parts' kinds, names and nodes only, never on their values. A sweep, a mismatch analysis or an
 * input-offset search solves one shape many times with other values; building the layout and
 * the pattern each time was a tenth of a mismatch run and much of its garbage, so shapes are
 * kept here by a key of what they depend on, and shared (both are never written after they are
 * built; the symbolic LU of a pattern is kept likewise in numeric/sparse-symbolic.ts).
 */
import { partNodes, type Circuit, type Part } from '../circuit/types';
import type { SparsePattern } from '../numeric/sparse-pattern';
import { buildLayout, circuitPattern, type MnaLayout } from './mna';
import { DeviceSet } from './nonlinear-devices';

/** What the engine lays out once per shape. */
export interface CircuitShape {
  readonly layout: MnaLayout;
  readonly pattern: SparsePattern;
}

/** Shapes kept, least recently used first (Map order); an edit session makes a new one per text. */
const shapes = new Map<string, CircuitShape>();
const SHAPES_KEPT = 16;

/**
 * Everything the layout and the pattern depend on: the declared nodes in order, and per part its
 * kind, name (branch rows and internal bases are named after parts), nodes, and for a bipolar
 * transistor whether it has a base resistance (an internal base node).
 */
function shapeKey(circuit: Circuit): string {
  let key = circuit.nodes.join(' ');
  for (const p of circuit.parts) {
    key += `\n${p.kind} ${p.name}`;
    for (const node of partNodes(p)) key += ` ${node}`;
    if (hasBaseResistance(p)) key += ' rb';
  }
  return key;
}

/**
 * The last parts seen with each `nodes` array, and their shape. The circuits of one sweep or
 * mismatch analysis share the elaborated circuit's `nodes` array and copy its parts with other
 * values, so comparing part by part finds their shape without building the key (its strings were
 * the largest garbage left in a mismatch run).
 */
const recent = new WeakMap<readonly string[], { parts: readonly Part[]; shape: CircuitShape }>();

/** True when every string field (kind, name, nodes, …) and the base-resistance flag agree, part by part. */
function sameStructure(a: readonly Part[], b: readonly Part[]): boolean {
  if (a === b) return true;
  if (a.length !== b.length) return false;
  for (let k = 0; k < a.length; k++) {
    const p = a[k] as unknown as Record<string, unknown>;
    const q = b[k] as unknown as Record<string, unknown>;
    if (p === q) continue;
    // Every string field, not a list of the structural ones: one added to a part later is compared too.
    for (const field in p) if (typeof p[field] === 'string' && p[field] !== q[field]) return false;
    for (const field in q) if (typeof q[field] === 'string' && p[field] !== q[field]) return false;
    if (hasBaseResistance(a[k]) !== hasBaseResistance(b[k])) return false;
  }
  return true;
}

function hasBaseResistance(p: Part): boolean {
  return (p.kind === 'npn' || p.kind === 'pnp') && p.model.rb > 0 && Number.isFinite(p.model.rb);
}

/** The shape of `circuit`, built on first sight of its key and shared after. */
export function circuitShape(circuit: Circuit): CircuitShape {
  const last = recent.get(circuit.nodes);
  if (last && sameStructure(last.parts, circuit.parts)) return last.shape;
  const shape = keptShape(circuit);
  recent.set(circuit.nodes, { parts: circuit.parts, shape });
  return shape;
}

function keptShape(circuit: Circuit): CircuitShape {
  const key = shapeKey(circuit);
  let shape = shapes.get(key);
  if (shape) {
    shapes.delete(key);
  } else {
    const layout = buildLayout(circuit);
    shape = { layout, pattern: circuitPattern(circuit, layout, new DeviceSet(circuit, layout)) };
    if (shapes.size >= SHAPES_KEPT) shapes.delete(shapes.keys().next().value!);
  }
  shapes.set(key, shape);
  return shape;
}
