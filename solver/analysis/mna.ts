/**
 * Modified nodal analysis: the unknowns and the stamps of the linear parts.
 *
 * Unknowns: the voltage of every node except ground (circuit nodes first, in the circuit's
 * order, then one internal base node per bipolar with rb > 0), then one branch current per
 * voltage source, inductor and vcvs (in part order), each flowing p→n (a→b) through the part.
 * Row i of the system is KCL at node i written as "currents leaving the node through the parts
 * = 0", or the branch equation of branch i.
 */
import { GROUND, partNodes, type Circuit } from '../circuit/types';
import { PatternBuilder, type SparsePattern } from '../numeric/sparse-pattern';

/** Index of a ground connection: stamps skip it. */
export const GROUND_INDEX = -1;

/** Largest conductance a resistor may stamp (a 0 Ω resistor becomes 1 pΩ, not Infinity). */
export const MAX_CONDUCTANCE = 1e12;

/** The unknowns of a circuit's MNA system. */
export interface MnaLayout {
  size: number;
  /** Number of voltage unknowns (circuit nodes plus internal nodes). */
  voltageCount: number;
  /** Node name → row; includes internal base nodes named `<part>:base`. */
  nodeIndex: Map<string, number>;
  /** Part name (vsrc, ind, vcvs) → row of its branch current. */
  branchIndex: Map<string, number>;
  /** Bipolar part name → row of its internal base node (only when rb > 0). */
  internalBase: Map<string, number>;
  /** For diagnostics: `node out`, `internal node q1:base`, `current of vcc`, one per row. */
  rowLabels: string[];
  /** Row → node name (for voltage rows) or part name (branch rows). */
  rowNames: string[];
}

/** Name of a bipolar transistor's internal base node (not a legal netlist name, so it cannot clash). */
export function internalBaseName(part: string): string {
  return `${part}:base`;
}

/** Lays out the unknowns of `circuit`. Nodes referenced by parts but missing from `nodes` are appended. */
export function buildLayout(circuit: Circuit): MnaLayout {
  const nodeIndex = new Map<string, number>();
  const rowNames: string[] = [];
  const rowLabels: string[] = [];
  const addNode = (name: string, label: string) => {
    if (name === GROUND || nodeIndex.has(name)) return;
    nodeIndex.set(name, rowNames.length);
    rowNames.push(name);
    rowLabels.push(label);
  };
  for (const n of circuit.nodes) addNode(n, `node ${n}`);
  for (const p of circuit.parts) for (const n of partNodes(p)) addNode(n, `node ${n}`);
  const internalBase = new Map<string, number>();
  for (const p of circuit.parts) {
    if ((p.kind === 'npn' || p.kind === 'pnp') && p.model.rb > 0 && Number.isFinite(p.model.rb)) {
      const name = internalBaseName(p.name);
      addNode(name, `internal base of ${p.name}`);
      internalBase.set(p.name, nodeIndex.get(name)!);
    }
  }
  const voltageCount = rowNames.length;
  const branchIndex = new Map<string, number>();
  for (const p of circuit.parts) {
    if (p.kind === 'vsrc' || p.kind === 'ind' || p.kind === 'vcvs') {
      branchIndex.set(p.name, rowNames.length);
      rowNames.push(p.name);
      rowLabels.push(`current of ${p.name}`);
    }
  }
  return { size: rowNames.length, voltageCount, nodeIndex, branchIndex, internalBase, rowLabels, rowNames };
}

/** Row of a node, or {@link GROUND_INDEX}. */
export function nodeRow(layout: MnaLayout, name: string): number {
  if (name === GROUND) return GROUND_INDEX;
  const i = layout.nodeIndex.get(name);
  return i === undefined ? GROUND_INDEX : i;
}

/**
 * Where stamps go: values on the circuit's sparse pattern ({@link PatternValues}), a dense
 * row-major matrix ({@link DenseMatrix}), or a {@link PatternBuilder} collecting the positions.
 * Ground (a negative index) is skipped by every implementation.
 */
export interface StampSink {
  add(r: number, c: number, v: number): void;
}

/** Values on a sparse pattern, one per slot; a stamp outside the pattern is an engine defect. */
export class PatternValues implements StampSink {
  constructor(readonly pattern: SparsePattern, readonly values: Float64Array = new Float64Array(pattern.nnz)) {}

  add(r: number, c: number, v: number): void {
    if (r < 0 || c < 0) return;
    const slot = this.pattern.slot(r, c);
    if (slot < 0) throw new Error(`stamp at (${r}, ${c}) outside the circuit's pattern`);
    this.values[slot] += v;
  }
}

/** A dense row-major n×n matrix as a stamp target. */
export class DenseMatrix implements StampSink {
  constructor(readonly n: number, readonly m: Float64Array = new Float64Array(n * n)) {}

  add(r: number, c: number, v: number): void {
    if (r >= 0 && c >= 0) this.m[r * this.n + c] += v;
  }
}

/** Adds `v` at (r, c), skipping ground. */
export function addEntry(m: StampSink, r: number, c: number, v: number): void {
  m.add(r, c, v);
}

/** Stamps a conductance g between rows a and b. */
export function stampConductance(m: StampSink, a: number, b: number, g: number): void {
  m.add(a, a, g);
  m.add(b, b, g);
  m.add(a, b, -g);
  m.add(b, a, -g);
}

/** What {@link stampLinear} should build. */
export interface LinearStampOptions {
  /** Factor on every independent source's DC value (source stepping); 0 leaves b untouched. */
  sourceScale: number;
  /** Conductance from every voltage unknown to ground (min_g, or larger during gmin stepping). */
  gmin: number;
}

/**
 * Stamps the linear parts into G (and into C when given: capacitors, and −L on each inductor's
 * branch diagonal) and the DC sources into b when given. At DC (C absent) capacitors are open and
 * inductors are shorts (their branch equation is v(a) − v(b) = 0). Bipolar base resistances are
 * stamped here too. `G`, `C` and `b` are added to, not cleared.
 */
export function stampLinear(
  circuit: Circuit,
  layout: MnaLayout,
  G: StampSink,
  C: StampSink | null,
  b: Float64Array | null,
  opts: LinearStampOptions,
): void {
  const row = (name: string) => nodeRow(layout, name);
  for (const p of circuit.parts) {
    switch (p.kind) {
      case 'res': {
        const g = conductanceOf(p.value);
        stampConductance(G, row(p.a), row(p.b), g);
        break;
      }
      case 'cap':
        if (C) stampConductance(C, row(p.a), row(p.b), p.value);
        break;
      case 'ind':
      case 'vsrc':
      case 'vcvs': {
        const k = layout.branchIndex.get(p.name)!;
        const pa = row(p.kind === 'ind' ? p.a : p.p);
        const pb = row(p.kind === 'ind' ? p.b : p.n);
        // KCL: the branch current leaves `pa` and enters `pb`.
        G.add(pa, k, 1);
        G.add(pb, k, -1);
        // Branch equation: v(pa) − v(pb) [− gain·v(cp, cn)] [− s·L·i] = dc.
        G.add(k, pa, 1);
        G.add(k, pb, -1);
        if (p.kind === 'vcvs') {
          G.add(k, row(p.cp), -p.gain);
          G.add(k, row(p.cn), p.gain);
        } else if (p.kind === 'ind') {
          if (C) C.add(k, k, -p.value);
        } else if (b) {
          b[k] += p.dc * opts.sourceScale;
        }
        break;
      }
      case 'isrc':
        if (b) {
          const i = p.dc * opts.sourceScale;
          const f = row(p.from);
          const t = row(p.to);
          if (f >= 0) b[f] -= i;
          if (t >= 0) b[t] += i;
        }
        break;
      case 'vccs': {
        const f = row(p.from);
        const t = row(p.to);
        const cp = row(p.cp);
        const cn = row(p.cn);
        G.add(f, cp, p.gm);
        G.add(f, cn, -p.gm);
        G.add(t, cp, -p.gm);
        G.add(t, cn, p.gm);
        break;
      }
      case 'npn':
      case 'pnp': {
        const bi = layout.internalBase.get(p.name);
        if (bi !== undefined) stampConductance(G, row(p.b), bi, 1 / p.model.rb);
        break;
      }
      default:
        break;
    }
  }
  if (opts.gmin > 0) for (let i = 0; i < layout.voltageCount; i++) G.add(i, i, opts.gmin);
}

/** 1/R, held finite for a zero or absurdly small resistance. */
export function conductanceOf(r: number): number {
  if (!(Math.abs(r) > 1 / MAX_CONDUCTANCE)) return r < 0 ? -MAX_CONDUCTANCE : MAX_CONDUCTANCE;
  return 1 / r;
}

/**
 * The circuit's sparsity pattern: every position its linear parts stamp into G or C, every
 * position `devices` stamps (Jacobian and capacitances), and the full diagonal. One pattern
 * serves the DC Newton matrix and the AC matrix alike, so a circuit shape is analysed once.
 */
export function circuitPattern(circuit: Circuit, layout: MnaLayout, devices: { collectPositions(sink: StampSink): void }): SparsePattern {
  const builder = new PatternBuilder(layout.size);
  const sink: StampSink = { add: (r, c) => builder.add(r, c) };
  stampLinear(circuit, layout, sink, sink, null, { sourceScale: 0, gmin: 1 });
  devices.collectPositions(sink);
  return builder.build();
}
