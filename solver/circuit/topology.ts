/**
 * Static topology checks on the flattened circuit, with union-find:
 *  - a node with a single connection (warning: usually a misspelt node name);
 *  - nodes with no DC path to ground (error): capacitors, current sources, the outputs of vccs,
 *    the control inputs of vcvs/vccs and MOS gates (and bulks) do not conduct at DC;
 *  - loops of voltage sources, vcvs outputs and inductors (error): such a loop fixes no current
 *    and contradicts itself unless its voltages happen to sum to zero.
 */
import type { DiagnosticBag } from './diagnostic';
import { GROUND, partNodes, type Part } from './types';

/** Union-find over node indices with path halving and union by size. */
export class UnionFind {
  private readonly parent: number[] = [];
  private readonly size: number[] = [];

  add(): number {
    this.parent.push(this.parent.length);
    this.size.push(1);
    return this.parent.length - 1;
  }

  find(x: number): number {
    while (this.parent[x] !== x) {
      this.parent[x] = this.parent[this.parent[x]];
      x = this.parent[x];
    }
    return x;
  }

  /** Joins the sets of a and b; false when they were already one set. */
  union(a: number, b: number): boolean {
    let ra = this.find(a);
    let rb = this.find(b);
    if (ra === rb) return false;
    if (this.size[ra] < this.size[rb]) [ra, rb] = [rb, ra];
    this.parent[rb] = ra;
    this.size[ra] += this.size[rb];
    return true;
  }
}

/** Pairs of terminals that conduct at DC. */
function dcEdges(p: Part): [string, string][] {
  switch (p.kind) {
    case 'res': case 'ind': return [[p.a, p.b]];
    case 'vsrc': return [[p.p, p.n]];
    case 'vcvs': return [[p.p, p.n]];
    case 'npn': case 'pnp': return [[p.b, p.e], [p.b, p.c]];
    case 'diode': return [[p.a, p.k]];
    case 'nmos': case 'pmos': return [[p.d, p.s]];
    default: return [];
  }
}

/** The branch of a part that fixes a voltage at DC (voltage sources, vcvs outputs, inductors). */
function voltageBranch(p: Part): [string, string] | undefined {
  if (p.kind === 'vsrc' || p.kind === 'vcvs') return [p.p, p.n];
  if (p.kind === 'ind') return [p.a, p.b];
  return undefined;
}

/** A list of names for a message, shortened past a few. */
function nameList(names: string[], max = 8): string {
  const shown = names.slice(0, max).map((n) => `\`${n}\``).join(', ');
  return names.length > max ? `${shown} and ${names.length - max} more` : shown;
}

/** Most loops reported, so that a pathological netlist stays fast. */
const MAX_LOOP_REPORTS = 20;

export interface TopologyOptions {
  /** Nodes of parts that failed to build: nothing is said about them. */
  brokenNodes?: Set<string>;
}

/** Runs all topology checks, reporting into `bag`. Never throws. */
export function checkTopology(parts: Part[], bag: DiagnosticBag, options: TopologyOptions = {}): void {
  const broken = options.brokenNodes ?? new Set<string>();
  const index = new Map<string, number>([[GROUND, 0]]);
  const names: string[] = [GROUND];
  const dc = new UnionFind();
  dc.add();
  const id = (n: string): number => {
    let k = index.get(n);
    if (k === undefined) {
      k = dc.add();
      index.set(n, k);
      names.push(n);
    }
    return k;
  };
  const connections: number[] = [0];
  const firstPart: (Part | undefined)[] = [undefined];
  for (const p of parts) {
    const nodes = partNodes(p);
    // An implicit bulk (b = s) is not a connection of its own.
    const counted = (p.kind === 'nmos' || p.kind === 'pmos') && p.b === p.s ? nodes.slice(0, 3) : nodes;
    for (const n of counted) {
      const k = id(n);
      connections[k] = (connections[k] ?? 0) + 1;
      firstPart[k] ??= p;
    }
    for (const [a, b] of dcEdges(p)) dc.union(id(a), id(b));
  }

  for (let k = 1; k < names.length; k++) {
    if (connections[k] === 1 && !broken.has(names[k])) {
      const p = firstPart[k] as Part;
      bag.warning('single-connection', p.loc, `The node \`${names[k]}\` has only one connection (\`${p.name}\`).`, 'a node joins at least two terminals: check its spelling');
    }
  }

  const groundRoot = dc.find(0);
  const floating = new Map<number, number[]>();
  for (let k = 1; k < names.length; k++) {
    const r = dc.find(k);
    if (r === groundRoot) continue;
    let group = floating.get(r);
    if (!group) floating.set(r, (group = []));
    group.push(k);
  }
  for (const group of floating.values()) {
    if (group.some((k) => broken.has(names[k]))) continue;
    const p = firstPart[group[0]] as Part;
    const list = group.map((k) => names[k]);
    bag.error('no-dc-path', p.loc,
      `${list.length === 1 ? 'The node' : 'The nodes'} ${nameList(list)} ${list.length === 1 ? 'has' : 'have'} no DC path to ground.`,
      'capacitors, current sources, controlled-source inputs and MOS gates do not conduct at DC: add a resistor or a source to ground');
  }

  checkVoltageLoops(parts, bag, id, names.length);
}

/** Finds loops made only of voltage-fixing branches. */
function checkVoltageLoops(parts: Part[], bag: DiagnosticBag, id: (n: string) => number, nodeCount: number): void {
  const uf = new UnionFind();
  for (let k = 0; k < nodeCount; k++) uf.add();
  const adjacency = new Map<number, { to: number; part: Part }[]>();
  let reports = 0;
  for (const p of parts) {
    const branch = voltageBranch(p);
    if (!branch) continue;
    const a = id(branch[0]);
    const b = id(branch[1]);
    if (a === b) {
      if (reports++ < MAX_LOOP_REPORTS)
        bag.error('vsource-loop', p.loc, `\`${p.name}\` is shorted: both of its ends are on the node \`${branch[0]}\`.`, 'connect its two ends to different nodes');
      continue;
    }
    if (uf.find(a) === uf.find(b)) {
      if (reports++ < MAX_LOOP_REPORTS) {
        const loop = [...findPath(adjacency, a, b).map((q) => q.name), p.name];
        bag.error('vsource-loop', p.loc, `The voltage sources and inductors ${nameList(loop)} form a loop.`, 'a loop of sources fixes no current: add a series resistance or remove one of them');
      }
    } else uf.union(a, b);
    for (const [x, y] of [[a, b], [b, a]]) {
      let list = adjacency.get(x);
      if (!list) adjacency.set(x, (list = []));
      list.push({ to: y, part: p });
    }
  }
}

/** Parts on a path from a to b over the voltage-branch graph (breadth-first). */
function findPath(adjacency: Map<number, { to: number; part: Part }[]>, a: number, b: number): Part[] {
  const via = new Map<number, { from: number; part: Part }>();
  const queue = [a];
  const seen = new Set([a]);
  for (let q = 0; q < queue.length; q++) {
    const x = queue[q];
    if (x === b) break;
    for (const edge of adjacency.get(x) ?? []) {
      if (seen.has(edge.to)) continue;
      seen.add(edge.to);
      via.set(edge.to, { from: x, part: edge.part });
      queue.push(edge.to);
    }
  }
  const path: Part[] = [];
  for (let x = b; x !== a; ) {
    const step = via.get(x);
    if (!step) break;
    path.unshift(step.part);
    x = step.from;
  }
  return path;
}
