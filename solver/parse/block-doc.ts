/**
 * The block doc convention (docs/netlist.md §3, "Documenting a block"): `#:` comment lines above
 * a `block` line (or at the top of the file) give the block's title, summary, pins, params and
 * tags. readBlockDocs reads them, with the pins and params taken from the block itself (the
 * solver's own statement parser, not a second reading of the text), so a doc line can never
 * invent a pin: it can only describe one, and a pin nobody described is named as a problem.
 *
 * Pure: no DOM, no Node. The team server calls it on a submitted source; the bench on hover.
 */
import { DiagnosticBag } from '../circuit/diagnostic';
import type { BlockDef, Body } from './ast';
import { parseFile } from './statements';

/** A pin or param with the text its doc line gives (undefined when it has none). */
export interface DocumentedPin {
  name: string;
  doc?: string;
}

export interface DocumentedParam extends DocumentedPin {
  /** The default as written on the block's `param` line (`10u`, `{ratio*w}`). */
  default?: string;
}

/** What the doc comment and the header of one block say. */
export interface BlockDoc {
  /** The block's name, as in `block NAME(…)`. */
  name: string;
  /** 1-based line of the block's header. */
  line: number;
  title?: string;
  /** Free text after the title; paragraphs (split by a bare `#:` line) joined by a newline. */
  summary?: string;
  /** The header's pins in order, each with its doc text. */
  pins: DocumentedPin[];
  /** The block's own `param`s in order, with their written defaults and doc text. */
  params: DocumentedParam[];
  tags: string[];
  /** Readable sentences: an undocumented pin or param, a doc line naming one the block lacks, … */
  problems: string[];
}

/** The marker that starts a doc line: `#:` as the first non-blank characters of a line. */
const DOC_LINE = /^\s*#:/;
const ORDINARY_COMMENT = /^\s*#/;
const BLANK = /^\s*$/;
/** `pin NAME — text`; the separator (em or en dash, `--`, `-` or `:`) is optional. */
const ENTRY = /^(pin|param)(?:\s+([A-Za-z_][A-Za-z0-9_]*))?\s*(?:—|–|--|-|:)?\s*(.*)$/;
const TAGS = /^tags(?:\s*:|\s|$)\s*(.*)$/;
/** The words that start an entry rather than free text. */
const ENTRY_WORD = /^(pin|param|tags)(?=\s|:|$)/;

type LineKind = 'doc' | 'comment' | 'blank' | 'code';

interface Group {
  /** 1-based lines of the group's first and last doc line. */
  first: number;
  last: number;
  /** The text after `#:` of each line, one leading space removed. */
  lines: { line: number; text: string }[];
}

interface Entry {
  kind: 'pin' | 'param' | 'tags';
  name?: string;
  line: number;
  text: string;
}

function classify(line: string): LineKind {
  if (DOC_LINE.test(line)) return 'doc';
  if (ORDINARY_COMMENT.test(line)) return 'comment';
  if (BLANK.test(line)) return 'blank';
  return 'code';
}

/** Every block of the file, nested ones included, in source order. */
function allBlocks(body: Body): BlockDef[] {
  const out: BlockDef[] = [];
  const walk = (b: Body): void => {
    for (const def of b.blocks) {
      out.push(def);
      walk(def);
    }
  };
  walk(body);
  return out.sort((a, b) => a.loc.line - b.loc.line);
}

/** Runs of consecutive `#:` lines. */
function docGroups(lines: string[], kinds: LineKind[]): Group[] {
  const groups: Group[] = [];
  let open: Group | undefined;
  kinds.forEach((kind, i) => {
    if (kind !== 'doc') {
      open = undefined;
      return;
    }
    const raw = lines[i].replace(DOC_LINE, '');
    const text = raw.startsWith(' ') ? raw.slice(1) : raw;
    if (!open) {
      open = { first: i + 1, last: i + 1, lines: [] };
      groups.push(open);
    }
    open.last = i + 1;
    open.lines.push({ line: i + 1, text: text.replace(/\s+$/, '') });
  });
  return groups;
}

/** First line of the statement whose name stands on `line` (a header may be continued with `\`). */
function statementStart(lines: string[], line: number): number {
  let start = line;
  while (start > 1 && /\\\s*$/.test(lines[start - 2].replace(/#.*$/, ''))) start--;
  return start;
}

/** What one doc group says, with the problems of its own shape. */
function readGroup(group: Group): { title?: string; summary?: string; entries: Entry[]; problems: string[] } {
  const problems: string[] = [];
  const entries: Entry[] = [];
  const paragraphs: string[][] = [];
  let title: string | undefined;
  let last: Entry | 'summary' | 'title' | undefined;
  for (const { line, text } of group.lines) {
    const content = text.trim();
    const indented = /^\s/.test(text) && content !== '';
    if (content === '') {
      if (last === 'summary') paragraphs.push([]);
      if (last === 'summary' || last === 'title') last = 'summary';
      continue;
    }
    if (indented && last && last !== 'title' && last !== 'summary') {
      if (last.kind === 'tags') entries.push({ kind: 'tags', line, text: content });
      else last.text = last.text ? `${last.text} ${content}` : content;
      continue;
    }
    const word = ENTRY_WORD.exec(content)?.[1];
    const tags = word === 'tags' ? TAGS.exec(content) : null;
    const entry = word === 'pin' || word === 'param' ? ENTRY.exec(content) : null;
    if (tags) {
      const e: Entry = { kind: 'tags', line, text: tags[1] };
      entries.push(e);
      last = e;
      continue;
    }
    if (entry) {
      const kind = entry[1] as 'pin' | 'param';
      if (!entry[2]) {
        problems.push(`Line ${line}: a \`#: ${kind}\` line names no ${kind}; write \`#: ${kind} NAME — what it ${kind === 'pin' ? 'is' : 'does'}\`.`);
        last = undefined;
        continue;
      }
      const e: Entry = { kind, name: entry[2], line, text: entry[3].trim() };
      entries.push(e);
      last = e;
      continue;
    }
    if (title === undefined && entries.length === 0) {
      title = content;
      last = 'title';
      continue;
    }
    if (entries.length > 0 && last !== 'summary') {
      problems.push(`Line ${line}: free text after the pin, param or tags lines is read as summary; indent it to continue the line above, or move it up under the title.`);
    }
    if (paragraphs.length === 0) paragraphs.push([]);
    paragraphs[paragraphs.length - 1].push(content);
    last = 'summary';
  }
  const summary = paragraphs.map((p) => p.join(' ')).filter((p) => p !== '').join('\n');
  return { title, summary: summary || undefined, entries, problems };
}

/** Fills one block's doc from its group (or reports that it has none). */
function documentBlock(def: BlockDef, group: Group | undefined): BlockDoc {
  const pins: DocumentedPin[] = def.pins.map((p) => ({ name: p.text }));
  const params: DocumentedParam[] = def.params.map((p) => ({ name: p.name.text, ...(p.value ? { default: p.value.text } : {}) }));
  const doc: BlockDoc = { name: def.name.text, line: def.loc.line, pins, params, tags: [], problems: [] };
  if (!group) {
    const what = [pins.length ? `pins ${pins.map((p) => p.name).join(', ')}` : '', params.length ? `params ${params.map((p) => p.name).join(', ')}` : ''].filter(Boolean).join('; ');
    doc.problems.push(`The block \`${doc.name}\` (line ${doc.line}) has no \`#:\` doc comment${what ? ` (title; ${what})` : ''}.`);
    return doc;
  }
  const read = readGroup(group);
  if (read.title !== undefined) doc.title = read.title;
  if (read.summary !== undefined) doc.summary = read.summary;
  doc.problems.push(...read.problems);
  if (read.title === undefined) doc.problems.push(`Line ${group.first}: the doc comment of \`${doc.name}\` has no title; its first \`#:\` line should say what the block is.`);
  const tables = { pin: pins, param: params } as const;
  for (const e of read.entries) {
    if (e.kind === 'tags') {
      for (const t of e.text.split(',').map((s) => s.trim()).filter(Boolean)) if (!doc.tags.includes(t)) doc.tags.push(t);
      continue;
    }
    const list: DocumentedPin[] = tables[e.kind];
    const target = list.find((x) => x.name === e.name);
    if (!target) {
      const known = list.map((x) => x.name);
      doc.problems.push(`Line ${e.line}: \`#: ${e.kind} ${e.name}\` names no ${e.kind} of \`${doc.name}\` (${known.length ? `its ${e.kind}s: ${known.join(', ')}` : `it has no ${e.kind}s`}).`);
    } else if (target.doc !== undefined) {
      doc.problems.push(`Line ${e.line}: the ${e.kind} \`${e.name}\` is documented twice.`);
    } else if (e.text === '') {
      target.doc = '';
      doc.problems.push(`Line ${e.line}: \`#: ${e.kind} ${e.name}\` says nothing about it.`);
    } else {
      target.doc = e.text;
    }
  }
  for (const p of pins) if (p.doc === undefined) doc.problems.push(`The pin \`${p.name}\` of \`${doc.name}\` is not documented: add \`#: pin ${p.name} — what it is\`.`);
  for (const p of params) if (p.doc === undefined) doc.problems.push(`The param \`${p.name}\` of \`${doc.name}\` is not documented: add \`#: param ${p.name} — what it does\`.`);
  return doc;
}

/**
 * For each `block` in `text` (nested ones included, in source order): its name, pins and params
 * from the block itself, and what its `#:` doc comment says about them. A doc group documents the
 * block whose header follows it with only blank lines and ordinary comments between; the file's
 * first group, when only blank lines and ordinary comments come before it, documents the file's
 * first top-level block if that block has no group of its own. Never throws.
 */
export function readBlockDocs(text: string): BlockDoc[] {
  if (typeof text !== 'string') return [];
  const file = parseFile(text, new DiagnosticBag());
  const defs = allBlocks(file);
  if (defs.length === 0) return [];
  const lines = text.split(/\r\n|\n|\r/);
  const kinds = lines.map(classify);
  const groups = docGroups(lines, kinds);
  const starts = new Map(defs.map((d) => [statementStart(lines, d.loc.line), d]));
  const byBlock = new Map<BlockDef, Group>();
  const stray: Group[] = [];
  for (const g of groups) {
    let next = g.last + 1;
    while (next <= lines.length && (kinds[next - 1] === 'blank' || kinds[next - 1] === 'comment')) next++;
    const def = starts.get(next);
    if (def && !byBlock.has(def)) byBlock.set(def, g);
    else stray.push(g);
  }
  const firstTop = defs.find((d) => !d.parent);
  const head = groups[0];
  if (head && stray[0] === head && firstTop && !byBlock.has(firstTop) && kinds.slice(0, head.first - 1).every((k) => k === 'blank' || k === 'comment')) {
    byBlock.set(firstTop, head);
    stray.shift();
  }
  const docs = defs.map((d) => documentBlock(d, byBlock.get(d)));
  for (const g of stray) {
    const owner = docs.find((d) => d.line > g.last) ?? docs[docs.length - 1];
    owner.problems.push(`Line ${g.first}: this \`#:\` doc comment documents no block; put it right above a \`block\` line, or at the top of the file for the file's block.`);
  }
  return docs;
}
