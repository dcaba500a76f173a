/**
 * "Propose as block" from the bench: what is handed to the propose dialog. A netlist that defines
 * blocks proposes the one at the cursor (the file goes as it is: block, models and the fixture
 * around it, as library files are laid out — docs/netlist.md §10). A netlist without blocks is
 * wrapped: its parts become the body of a new block with the pins the designer chose, and its
 * sources, analyses and ports become the fixture around one instance of it.
 */
import { readBlockDocs } from '../../../solver';

/** A block the text defines, by the line of its header. */
export interface DefinedBlock {
  name: string;
  line: number;
}

/** Categories a block name suggests (the seed library's folders); "blocks" when none fits. */
const CATEGORY_HINTS: readonly [RegExp, string][] = [
  [/mirror|widlar|wilson/, 'mirrors'],
  [/pair|diff/, 'pairs'],
  [/tail|sink|source/, 'tails'],
  [/shift|follower/, 'shifters'],
  [/cascode/, 'cascodes'],
];

/** The blocks `text` defines, in text order. */
export function definedBlocks(text: string): DefinedBlock[] {
  return readBlockDocs(text).map((d) => ({ name: d.name, line: d.line }));
}

/** The block whose header is the nearest at or above `cursorLine` (else the first one). */
export function blockAtCursor(blocks: readonly DefinedBlock[], cursorLine: number): DefinedBlock | undefined {
  const above = blocks.filter((b) => b.line <= cursorLine);
  return above.at(-1) ?? blocks[0];
}

/** A path for a block name: its guessed category and the name in the server's spelling. */
export function suggestedPath(name: string): string {
  const clean = name.toLowerCase().replace(/[^a-z0-9_]/g, '_').replace(/^[^a-z]+/, '').slice(0, 60) || 'block';
  const category = CATEGORY_HINTS.find(([re]) => re.test(clean))?.[1] ?? 'blocks';
  return `${category}/${clean}`;
}

/** Part kinds that drive a circuit: they stay in the fixture when a netlist is wrapped. */
const SOURCE_KINDS = new Set(['vsrc', 'isrc']);

const STATEMENT = /^\s*([A-Za-z_][A-Za-z0-9_.]*)(\s*:\s*([A-Za-z_][A-Za-z0-9_]*)\s*\()?/;

/** The nodes a wrapped netlist's sources touch (ground excluded): the pins offered first. */
export function drivenNodes(parts: readonly { name: string; kind: string }[], text: string, nodes: readonly string[]): string[] {
  const sources = new Set(parts.filter((p) => SOURCE_KINDS.has(p.kind)).map((p) => p.name));
  const found = new Set<string>();
  for (const statement of statements(text)) {
    const m = STATEMENT.exec(statement);
    if (!m?.[2] || !sources.has(m[1])) continue;
    const inside = statement.slice(statement.indexOf('(') + 1, statement.indexOf(')'));
    for (const word of inside.split(',')) {
      const node = word.split('=').at(-1)!.trim();
      if (node && node !== 'gnd' && node !== '0' && nodes.includes(node)) found.add(node);
    }
  }
  return nodes.filter((n) => found.has(n));
}

/**
 * A netlist without blocks as a library file: the block `name(pins)` holding its parts (and a
 * copy of its params, so the block uses only its own), then a fixture with its title, sources,
 * analyses and ports around the instance `x1`. Its measures and checks name the parts directly;
 * they are kept, commented out, for the author to rewrite against `x1.…`.
 */
export function wrapAsBlock(text: string, name: string, pins: readonly string[], partKinds: ReadonlyMap<string, string>): string {
  const top: string[] = [];
  const params: string[] = [];
  const body: string[] = [];
  const fixture: string[] = [];
  const later: string[] = [];
  let title = '';
  let depth = 0;
  for (const statement of statements(text)) {
    const trimmed = statement.trim();
    const word = /^[A-Za-z_]+/.exec(trimmed)?.[0] ?? '';
    if (depth > 0 || word === 'block') {
      // Blocks the netlist defines stay beside the new one (its body may use them).
      top.push(statement);
      if (word === 'block') depth++;
      if (word === 'end') depth--;
      continue;
    }
    if (!trimmed || trimmed.startsWith('#')) continue;
    if (word === 'title') title = trimmed.replace(/^title\s*/, '');
    else if (word === 'model' || word === 'option' || word === 'use') top.push(statement);
    else if (word === 'param') params.push(statement);
    else if (word === 'analyze' || word === 'ports') fixture.push(statement);
    else if (word === 'measure' || word === 'check') later.push(statement);
    else {
      const m = STATEMENT.exec(trimmed);
      const kind = m?.[2] ? partKinds.get(m[1]) ?? m[3] : undefined;
      if (kind && SOURCE_KINDS.has(kind)) fixture.push(statement);
      else body.push(statement);
    }
  }
  const heading = title || `${name} block`;
  return [
    `#: ${heading}`,
    '#: What it does, in a sentence or two (the catalogue shows this).',
    ...pins.map((p) => `#: pin ${p} — what connects here`),
    '#: tags',
    '',
    ...top,
    ...(top.length ? [''] : []),
    `block ${name}(${pins.join(', ')})`,
    ...params.map((p) => `  ${p.trim()}`),
    ...body.map((p) => `  ${p.trim()}`),
    'end',
    '',
    '# ── Fixture ── what this file solves on its own (a reviewer re-solves it and compares the checks).',
    `title  ${heading}`,
    ...params,
    ...fixture.sort(sourcesFirst),
    `x1: ${name}(${pins.map((p) => `${p}=${p}`).join(', ')})`,
    ...(later.length ? ['', '# The netlist\'s measures and checks name its parts directly: rewrite them against x1.… (e.g. ic(x1.q1)).', ...later.map((l) => `# ${l.trim()}`)] : []),
    '',
  ].join('\n');
}

/** Sources before analyses and ports, each group in text order. */
function sourcesFirst(a: string, b: string): number {
  const rank = (s: string) => (/^\s*(analyze|ports)\b/.test(s) ? 1 : 0);
  return rank(a) - rank(b);
}

/** The text's statements: physical lines joined where one ends with `\`. */
function statements(text: string): string[] {
  const out: string[] = [];
  let pending = '';
  for (const line of text.split('\n')) {
    if (/\\\s*$/.test(line)) {
      pending += `${line}\n`;
      continue;
    }
    out.push(pending + line);
    pending = '';
  }
  if (pending) out.push(pending);
  return out;
}
