import { readdirSync, readFileSync, statSync } from 'node:fs';
import { dirname, join, relative, resolve, sep } from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';

/**
 * The solver's stages, in the order they may import each other: a folder imports only itself and
 * folders listed before it, so no stage reaches back into one that depends on it and there is no
 * cycle between folders. DEVELOPERS.md (Where things are → solver/) gives the same order.
 *
 * - numeric: dense and sparse real and complex LU (pattern, ordering, equilibration), phasor
 *   arithmetic, curves from phasors; imports nothing.
 * - circuit: the flattened circuit's types, the diagnostics, the requests' types, the result
 *   contract (§5), topology checks.
 * - language: the vocabulary tables (statements, analyses, functions, part kinds).
 * - report: the text report and the SI formatter; it reads only the result and the vocabulary,
 *   and the operating point words its messages with the formatter, so it stands this early.
 * - parse: text → statements and requests; the types of parseNetlist.
 * - elaborate: statements → one flat circuit, and parseNetlist, which runs parse and elaborate.
 * - devices: the device equations.
 * - analysis: the engine (MNA, operating point, small signal, AC, DC sweep, ports).
 * - measure: measures and checks on the analyses' results.
 * - run: a netlist or circuit solved end to end, the analyses dispatched by kind.
 * - testing: helpers for tests only; no stage may import it.
 *
 * The files at the top of solver/ (index.ts and the re-exports where callers have always found
 * things) are the public face: they may import any folder and no folder imports them. Tests are
 * left out: a test may check a stage through the whole solver.
 */
const STAGE_ORDER = ['numeric', 'circuit', 'language', 'report', 'parse', 'elaborate', 'devices', 'analysis', 'measure', 'run', 'testing'];

const SOLVER = dirname(fileURLToPath(import.meta.url));

/** Every non-test TypeScript file under `dir`. */
function sources(dir = SOLVER): string[] {
  return readdirSync(dir).flatMap((name) => {
    const path = join(dir, name);
    if (statSync(path).isDirectory()) return sources(path);
    return name.endsWith('.ts') && !name.endsWith('.test.ts') ? [path] : [];
  });
}

/** Relative module paths of every import and re-export of a file (type-only and dynamic ones too). */
function importsOf(text: string): string[] {
  const fromLines = [...text.matchAll(/^\s*(?:import|export)\b[^'";]*?\bfrom\s+['"](\.[^'"]+)['"]/gm)].map((m) => m[1]);
  const bare = [...text.matchAll(/^\s*import\s+['"](\.[^'"]+)['"]/gm)].map((m) => m[1]);
  const dynamic = [...text.matchAll(/\bimport\(\s*['"](\.[^'"]+)['"]\s*\)/g)].map((m) => m[1]);
  return [...fromLines, ...bare, ...dynamic];
}

/** The top-level folder of solver/ a path lies in (`.` for the files at the top). */
function stageOf(path: string): string {
  const rel = relative(SOLVER, path);
  return rel.includes(sep) ? rel.split(sep)[0] : '.';
}

/** folder → the folders it imports, with one importing file and module for each edge. */
function folderGraph(): Map<string, Map<string, string>> {
  const graph = new Map<string, Map<string, string>>();
  for (const file of sources()) {
    const from = stageOf(file);
    const edges = graph.get(from) ?? new Map<string, string>();
    graph.set(from, edges);
    for (const spec of importsOf(readFileSync(file, 'utf8'))) {
      const target = resolve(dirname(file), spec);
      if (relative(SOLVER, target).startsWith('..')) continue;
      const to = stageOf(target);
      if (to !== from && !edges.has(to)) edges.set(to, `${relative(SOLVER, file)} imports ${spec}`);
    }
  }
  return graph;
}

/** The first cycle found, as a path of folders ending where it began, or undefined. */
function findCycle(graph: Map<string, Iterable<string>>): string[] | undefined {
  const state = new Map<string, 'open' | 'done'>();
  const path: string[] = [];
  const visit = (node: string): string[] | undefined => {
    if (state.get(node) === 'done') return undefined;
    if (state.get(node) === 'open') return [...path.slice(path.indexOf(node)), node];
    state.set(node, 'open');
    path.push(node);
    for (const next of graph.get(node) ?? []) {
      const cycle = visit(next);
      if (cycle) return cycle;
    }
    path.pop();
    state.set(node, 'done');
    return undefined;
  };
  for (const node of [...graph.keys()].sort()) {
    const cycle = visit(node);
    if (cycle) return cycle;
  }
  return undefined;
}

describe("the solver's folders", () => {
  const graph = folderGraph();

  it('import each other without a cycle', () => {
    const plain = new Map([...graph].map(([from, edges]) => [from, [...edges.keys()]]));
    expect(findCycle(plain)?.join(' → ')).toBeUndefined();
  });

  it('each stand in the stage order', () => {
    const unplaced = [...graph.keys()].filter((folder) => folder !== '.' && !STAGE_ORDER.includes(folder));
    expect(unplaced, 'add a new folder to STAGE_ORDER (and DEVELOPERS.md)').toEqual([]);
  });

  it('import only folders earlier in the stage order', () => {
    const backwards: string[] = [];
    for (const [from, edges] of graph) {
      if (from === '.') continue;
      for (const [to, where] of edges) {
        if (to === '.') backwards.push(`${where}: nothing inside a folder imports the top of solver/`);
        else if (STAGE_ORDER.indexOf(to) > STAGE_ORDER.indexOf(from)) backwards.push(`${where}: ${to} comes after ${from}`);
      }
    }
    expect(backwards).toEqual([]);
  });

  it('the cycle finder finds a cycle when there is one', () => {
    const cyclic = new Map([['a', ['b']], ['b', ['c']], ['c', ['a']], ['d', ['a']]]);
    expect(findCycle(cyclic)).toEqual(['a', 'b', 'c', 'a']);
    expect(findCycle(new Map([['a', ['b']], ['b', []]]))).toBeUndefined();
  });

  it('reads import and re-export lines, type-only, bare and dynamic ones included', () => {
    const text = [
      "import { a } from './a';",
      "import type { B } from '../b/b';",
      "export * from '../c/c';",
      'export { d } from "./d";',
      'import {',
      '  f,',
      "} from './f';",
      "import './g';",
      "const h = import('../h/h');",
      "const x = 'from ./e';",
    ].join('\n');
    expect(importsOf(text).sort()).toEqual(['../b/b', '../c/c', '../h/h', './a', './d', './f', './g']);
  });
});
