/**
 * Hover help for blocks: over a `use path@version` line, or over the kind of an instance of a
 * block (`m1: wilson_npn(…)`), a tooltip with the block's title, summary, pins and params (with
 * their doc lines and defaults) and where it came from (workspace library, seed library…) in
 * which state. Used blocks are read from the worker's `uses` (the `#:` doc comments of the
 * resolved files); blocks written in the netlist itself from its own text with readBlockDocs,
 * loaded on the first such hover so the bench's first paint does not carry the parser.
 */
import { Prec, StateEffect, StateField, type EditorState, type Extension, type Text } from '@codemirror/state';
import { hoverTooltip, keymap, showTooltip, type Command, type EditorView, type Tooltip } from '@codemirror/view';
import { PART_KINDS, readBlockDocs, type BlockDoc } from '../../../../solver';
import { STATE_CHIP } from '../../library/block-words';
import type { BlockOrigin, LibraryEntry, NetlistNames, UsedBlock, UsedBlockState } from '../solver-protocol';

const USE = /^(\s*)(use\s+([A-Za-z0-9_/]+)@(\d+))/;
const INSTANCE = /^(\s*[A-Za-z_][A-Za-z0-9_]*\s*:\s*)([A-Za-z_][A-Za-z0-9_]*)\s*\(/;

/** How an origin reads after the state: "vetted · workspace library". */
const ORIGIN_WORDS: Record<BlockOrigin, string> = {
  workspace: 'workspace library',
  seed: 'seed library',
  cache: 'saved copy (server not reached)',
  share: 'pinned in the shared link',
};

/** What a hover is over, with its span in the line. */
export type HoverTarget =
  | { kind: 'use'; path: string; version: number; from: number; to: number }
  | { kind: 'instance'; name: string; from: number; to: number };

/** Everything the tooltip shows about one block. */
export interface BlockHelp {
  /** `mirrors/wilson_npn@3`, or `block mirror2` for a block of the netlist itself. */
  heading: string;
  /** "✓ vetted · workspace library", "defined in this netlist, line 4", "not resolved". */
  status: string;
  /** Styles the status: retired and unresolved blocks stand out. */
  tone: 'vetted' | 'caution' | 'plain';
  title?: string;
  summary?: string;
  pins: { name: string; doc?: string }[];
  params: { name: string; default?: string; doc?: string }[];
  /** "A newer vetted version exists: @4." */
  note?: string;
}

/** The `use` line or instance kind under `offset` (0-based in the line), if any. */
export function hoverTargetAt(lineText: string, offset: number): HoverTarget | undefined {
  const use = USE.exec(lineText);
  if (use) {
    const from = use[1].length;
    const to = from + use[2].length;
    return offset >= from && offset <= to ? { kind: 'use', path: use[3], version: Number(use[4]), from, to } : undefined;
  }
  const inst = INSTANCE.exec(lineText);
  if (!inst) return undefined;
  const from = inst[1].length;
  const to = from + inst[2].length;
  if (offset < from || offset > to || Object.hasOwn(PART_KINDS, inst[2])) return undefined;
  return { kind: 'instance', name: inst[2], from, to };
}

const blockName = (path: string) => path.slice(path.lastIndexOf('/') + 1);

function stateStatus(state: UsedBlockState | undefined, origin: BlockOrigin | 'workspace' | 'seed' | undefined): Pick<BlockHelp, 'status' | 'tone'> {
  const chip = state ? STATE_CHIP[state] : undefined;
  const words = [chip ? `${chip.symbol} ${chip.label.toLowerCase()}` : state, origin ? ORIGIN_WORDS[origin] : undefined].filter(Boolean).join(' · ');
  return { status: words || 'library block', tone: state === 'vetted' ? 'vetted' : state === 'retired' ? 'caution' : 'plain' };
}

function fromDoc(doc: BlockDoc | undefined): Pick<BlockHelp, 'title' | 'summary' | 'pins' | 'params'> {
  return {
    title: doc?.title,
    summary: doc?.summary,
    pins: doc?.pins.map((p) => ({ name: p.name, doc: p.doc || undefined })) ?? [],
    params: doc?.params.map((p) => ({ name: p.name, default: p.default, doc: p.doc || undefined })) ?? [],
  };
}

/** What to show for a used block, from the worker's resolution and, before it, the library index. */
function usedHelp(path: string, version: number, use: UsedBlock | undefined, library: readonly LibraryEntry[]): BlockHelp | undefined {
  const entry = library.find((e) => e.path === path);
  if (!use && !entry) return undefined;
  const doc = use?.docs.find((d) => d.name === blockName(path)) ?? use?.docs[0];
  const help: BlockHelp = {
    heading: `${path}@${version}`,
    ...fromDoc(doc),
    ...(use && !use.origin
      ? { status: '⚠ not resolved: see the problems list', tone: 'caution' as const }
      : stateStatus(use?.state ?? entry?.versions.find((v) => v.version === version)?.state, use?.origin ?? entry?.origin)),
  };
  help.title ??= entry?.title || undefined;
  help.summary ??= entry?.summary || undefined;
  if (use?.newestVetted && use.newestVetted > version) help.note = `A newer vetted version exists: @${use.newestVetted}.`;
  return help;
}

/** The block's help for a hover target; `localDocs` reads the blocks defined in the text itself. */
export async function blockHelpFor(target: HoverTarget, lineNo: number, names: NetlistNames, library: readonly LibraryEntry[], localDocs: () => Promise<BlockDoc[]>): Promise<BlockHelp | undefined> {
  if (target.kind === 'use') {
    const same = names.uses.filter((u) => u.path === target.path && u.version === target.version);
    return usedHelp(target.path, target.version, same.find((u) => u.line === lineNo) ?? same[0], library);
  }
  const use = names.uses.find((u) => blockName(u.path) === target.name);
  if (use) return usedHelp(use.path, use.version, use, library);
  const doc = (await localDocs()).find((d) => d.name === target.name);
  if (!doc) return undefined;
  return { heading: `block ${doc.name}`, status: `defined in this netlist, line ${doc.line}`, tone: 'plain', ...fromDoc(doc) };
}

function el<K extends keyof HTMLElementTagNameMap>(tag: K, className: string, text?: string): HTMLElementTagNameMap[K] {
  const node = document.createElement(tag);
  node.className = className;
  if (text !== undefined) node.textContent = text;
  return node;
}

function nameList(caption: string, rows: { name: string; default?: string; doc?: string }[]): HTMLElement {
  const section = el('div', 'nw-block-doc-section');
  section.append(el('div', 'nw-block-doc-caption', caption));
  const list = el('dl', 'nw-block-doc-names');
  for (const row of rows) {
    const term = el('dt', '');
    term.append(el('code', '', row.name));
    if (row.default !== undefined) term.append(el('span', 'nw-block-doc-default', ` = ${row.default}`));
    list.append(term, el('dd', row.doc ? '' : 'nw-block-doc-missing', row.doc ?? 'not documented'));
  }
  section.append(list);
  return section;
}

/** The tooltip's DOM: plain elements styled by editor-theme.ts (`.nw-block-doc…`). */
export function renderBlockHelp(help: BlockHelp): HTMLElement {
  const root = el('div', 'nw-block-doc');
  const head = el('div', 'nw-block-doc-head');
  head.append(el('code', 'nw-block-doc-heading', help.heading), el('span', `nw-block-doc-status nw-tone-${help.tone}`, help.status));
  root.append(head);
  if (help.title) root.append(el('div', 'nw-block-doc-title', help.title));
  for (const paragraph of help.summary?.split('\n') ?? []) root.append(el('p', 'nw-block-doc-summary', paragraph));
  if (help.pins.length) root.append(nameList('Pins', help.pins));
  if (help.params.length) root.append(nameList('Params', help.params));
  if (help.note) root.append(el('div', 'nw-block-doc-note', help.note));
  return root;
}

/** The blocks of a document, read once per version of the text. */
const localCache = new WeakMap<Text, Promise<BlockDoc[]>>();

function localDocsOf(doc: Text): Promise<BlockDoc[]> {
  let docs = localCache.get(doc);
  if (!docs) {
    // Read a task later, off the keystroke that asked for the hover.
    docs = Promise.resolve(doc).then((d) => readBlockDocs(d.toString())).catch(() => []);
    localCache.set(doc, docs);
  }
  return docs;
}

/** The hover source: a tooltip for the block under `pos`, or null. */
export function blockHoverSource(names: () => NetlistNames, library: () => readonly LibraryEntry[]) {
  return async (view: EditorView, pos: number): Promise<Tooltip | null> => {
    const line = view.state.doc.lineAt(pos);
    const target = hoverTargetAt(line.text, pos - line.from);
    if (!target) return null;
    const help = await blockHelpFor(target, line.number, names(), library(), () => localDocsOf(view.state.doc));
    if (!help) return null;
    return { pos: line.from + target.from, end: line.from + target.to, above: true, create: () => ({ dom: renderBlockHelp(help) }) };
  };
}

/** Sets (or, with null, closes) the block help opened from the keyboard. */
const setKeyboardHelp = StateEffect.define<Tooltip | null>();

/** The block help opened from the keyboard: it closes when the text or the cursor moves. */
const keyboardHelp = StateField.define<Tooltip | null>({
  create: () => null,
  update(value, tr) {
    for (const effect of tr.effects) if (effect.is(setKeyboardHelp)) return effect.value;
    return tr.docChanged || tr.selection ? null : value;
  },
  provide: (field) => showTooltip.from(field),
});

/** The key that opens the block help at the cursor (listed in the help sheet). */
export const BLOCK_HELP_KEY = 'F2';

/**
 * Opens the hover's block help at the cursor, for a keyboard: over a `use` line or the kind of
 * an instance (the cursor inside the word or just after it). True when there was a word to ask about.
 */
export function openBlockHelpAtCursor(source: ReturnType<typeof blockHoverSource>): Command {
  return (view) => {
    const head = view.state.selection.main.head;
    void (async () => {
      const tip = (await source(view, head)) ?? (head > 0 ? await source(view, head - 1) : null);
      // Shown only if the cursor has not moved meanwhile.
      if (tip && view.state.selection.main.head === head) view.dispatch({ effects: setKeyboardHelp.of(tip) });
    })();
    return true;
  };
}

/** Whether the keyboard's block help is open (for tests). */
export function keyboardHelpOpen(state: EditorState): boolean {
  return state.field(keyboardHelp, false) != null;
}

/** The editor extension: block help on hover, and on BLOCK_HELP_KEY at the cursor (Escape closes it). */
export function libraryHover(names: () => NetlistNames, library: () => readonly LibraryEntry[]): Extension {
  const source = blockHoverSource(names, library);
  return [
    hoverTooltip(source, { hoverTime: 350 }),
    keyboardHelp,
    // Ahead of the default keymap, whose Escape would otherwise only simplify the selection.
    Prec.high(keymap.of([
      { key: BLOCK_HELP_KEY, run: openBlockHelpAtCursor(source), preventDefault: true },
      { key: 'Escape', run: (view) => (keyboardHelpOpen(view.state) ? (view.dispatch({ effects: setKeyboardHelp.of(null) }), true) : false) },
    ])),
  ];
}
