import { EditorState } from '@codemirror/state';
import { defaultKeymap } from '@codemirror/commands';
import { EditorView, keymap } from '@codemirror/view';
import { readBlockDocs } from '../../../../solver';
import { NO_NAMES, type LibraryEntry, type NetlistNames, type UsedBlock } from '../solver-protocol';
import { blockHoverSource, hoverTargetAt, keyboardHelpOpen, libraryHover, openBlockHelpAtCursor } from './library-hover';

// The start of the seed library's Wilson mirror (library/mirrors/wilson_npn@3.nwl), read by the real parser.
const WILSON_FILE = `#: Wilson npn current mirror
#: Three transistors: qc sits on the output; qa and qb close a shunt-feedback loop.
#: pin in — reference current in; sits two VBE above \`rail\`
#: pin out — mirrored current in; needs about 2·VBE of headroom above \`rail\`
#: pin rail — emitters, usually vee or gnd
#: param area — emitter area of the output device
#: tags npn, mirror

model q_wilson: npn(is=1e-16, beta=100, va=80)

block wilson_npn(in, out, rail)
  param area = 1
  qa: npn(c=in, b=mid, e=rail) q_wilson
  qb: npn(c=mid, b=mid, e=rail) q_wilson
  qc: npn(c=out, b=in, e=mid) q_wilson area=area
end
`;

const NETLIST = `title Mirror test
use mirrors/wilson_npn@3
#: Two-transistor mirror
#: pin in — reference side
#: pin out — output
#: pin rail — emitters
#: param ratio — area ratio
block mirror2(in, out, rail)
  param ratio = 1
  qa: npn(c=in, b=in, e=rail) qn
  qb: npn(c=out, b=in, e=rail) qn area=ratio
end
m1: wilson_npn(in=ref, out=out, rail=gnd)
x1: mirror2(in=ref2, out=o2, rail=gnd) ratio=2
q9: npn(c=out, b=ref, e=gnd) qn
# m2: wilson_npn(in=a, out=b, rail=gnd)
`;

function used(over: Partial<UsedBlock> = {}): UsedBlock {
  return { line: 2, path: 'mirrors/wilson_npn', version: 3, origin: 'workspace', state: 'vetted', newestVetted: 3, docs: readBlockDocs(WILSON_FILE), ...over };
}

function viewOf(text: string): EditorView {
  return new EditorView({ state: EditorState.create({ doc: text }) });
}

/** The tooltip's DOM for a hover at `column` (0-based) of line `lineNo`, or null. */
async function hoverAt(view: EditorView, lineNo: number, column: number, names: NetlistNames, library: LibraryEntry[] = []): Promise<HTMLElement | null> {
  const tooltip = await blockHoverSource(() => names, () => library)(view, view.state.doc.line(lineNo).from + column);
  if (!tooltip) return null;
  return tooltip.create(view).dom as HTMLElement;
}

const text = (dom: HTMLElement | null, selector: string) => [...(dom?.querySelectorAll(selector) ?? [])].map((e) => e.textContent);

describe('hoverTargetAt', () => {
  it('finds the `use` span and the kind of an instance, and nothing else', () => {
    expect(hoverTargetAt('  use mirrors/wilson_npn@3 # pinned', 10)).toEqual({ kind: 'use', path: 'mirrors/wilson_npn', version: 3, from: 2, to: 26 });
    expect(hoverTargetAt('  use mirrors/wilson_npn@3 # pinned', 30)).toBeUndefined();
    expect(hoverTargetAt('m1: wilson_npn(in=ref)', 6)).toEqual({ kind: 'instance', name: 'wilson_npn', from: 4, to: 14 });
    expect(hoverTargetAt('m1: wilson_npn(in=ref)', 1)).toBeUndefined();
    expect(hoverTargetAt('m1: wilson_npn(in=ref)', 18)).toBeUndefined();
    expect(hoverTargetAt('q1: npn(c=a, b=b, e=c) qn', 5)).toBeUndefined();
    expect(hoverTargetAt('# m1: wilson_npn(in=ref)', 8)).toBeUndefined();
  });
});

describe('block hover', () => {
  const names: NetlistNames = { ...NO_NAMES, uses: [used()] };

  it('shows a use line: title, summary, pins and params with their docs and defaults, state and origin', async () => {
    const view = viewOf(NETLIST);
    const dom = await hoverAt(view, 2, 8, names);
    expect(dom?.querySelector('.nw-block-doc-heading')?.textContent).toBe('mirrors/wilson_npn@3');
    expect(dom?.querySelector('.nw-block-doc-status')?.textContent).toBe('✓ vetted · workspace library');
    expect(dom?.querySelector('.nw-block-doc-status')?.classList).toContain('nw-tone-vetted');
    expect(dom?.querySelector('.nw-block-doc-title')?.textContent).toBe('Wilson npn current mirror');
    expect(dom?.querySelector('.nw-block-doc-summary')?.textContent).toContain('shunt-feedback loop');
    expect(text(dom, 'dt')).toEqual(['in', 'out', 'rail', 'area = 1']);
    expect(text(dom, 'dd')).toEqual([
      'reference current in; sits two VBE above `rail`', 'mirrored current in; needs about 2·VBE of headroom above `rail`', 'emitters, usually vee or gnd',
      'emitter area of the output device',
    ]);
    expect(dom?.querySelector('.nw-block-doc-note')).toBeNull();
    view.destroy();
  });

  it('shows the same help over the kind of an instance of a used block', async () => {
    const view = viewOf(NETLIST);
    const dom = await hoverAt(view, 13, 'm1: wil'.length, names);
    expect(dom?.querySelector('.nw-block-doc-heading')?.textContent).toBe('mirrors/wilson_npn@3');
    expect(text(dom, 'dt')).toContain('rail');
    view.destroy();
  });

  it('marks a retired version and names the newer vetted one', async () => {
    const view = viewOf(NETLIST);
    const dom = await hoverAt(view, 2, 5, { ...NO_NAMES, uses: [used({ state: 'retired', newestVetted: 4, origin: 'cache' })] });
    expect(dom?.querySelector('.nw-block-doc-status')?.textContent).toBe('⊘ retired · saved copy (server not reached)');
    expect(dom?.querySelector('.nw-block-doc-status')?.classList).toContain('nw-tone-caution');
    expect(dom?.querySelector('.nw-block-doc-note')?.textContent).toBe('A newer vetted version exists: @4.');
    view.destroy();
  });

  it('says when a use could not be resolved, and falls back on the library index before the first solve', async () => {
    const view = viewOf(NETLIST);
    const unresolved = await hoverAt(view, 2, 5, { ...NO_NAMES, uses: [used({ origin: undefined, state: undefined, docs: [] })] });
    expect(unresolved?.querySelector('.nw-block-doc-status')?.textContent).toContain('not resolved');
    const library: LibraryEntry[] = [{ path: 'mirrors/wilson_npn', title: 'Wilson npn current mirror', summary: 'From the catalogue.', versions: [{ version: 3, state: 'vetted' }], origin: 'seed' }];
    const early = await hoverAt(view, 2, 5, NO_NAMES, library);
    expect(early?.querySelector('.nw-block-doc-status')?.textContent).toBe('✓ vetted · seed library');
    expect(early?.querySelector('.nw-block-doc-summary')?.textContent).toBe('From the catalogue.');
    expect(await hoverAt(view, 2, 5, NO_NAMES)).toBeNull();
    view.destroy();
  });

  it('shows a block defined in the netlist itself, read from the text', async () => {
    const view = viewOf(NETLIST);
    const dom = await hoverAt(view, 14, 'x1: mir'.length, NO_NAMES);
    expect(dom?.querySelector('.nw-block-doc-heading')?.textContent).toBe('block mirror2');
    expect(dom?.querySelector('.nw-block-doc-status')?.textContent).toBe('defined in this netlist, line 8');
    expect(dom?.querySelector('.nw-block-doc-title')?.textContent).toBe('Two-transistor mirror');
    expect(text(dom, 'dt')).toEqual(['in', 'out', 'rail', 'ratio = 1']);
    expect(text(dom, 'dd')).toEqual(['reference side', 'output', 'emitters', 'area ratio']);
    view.destroy();
  });

  it('shows nothing over built-in parts, nodes, comments, titles or unknown kinds', async () => {
    const view = viewOf(NETLIST);
    expect(await hoverAt(view, 15, 5, names)).toBeNull(); // npn
    expect(await hoverAt(view, 13, 20, names)).toBeNull(); // a node
    expect(await hoverAt(view, 16, 8, names)).toBeNull(); // commented-out instance
    expect(await hoverAt(view, 1, 8, names)).toBeNull(); // title
    const unknown = viewOf('z1: nothing_here(a=b)\n');
    expect(await hoverAt(unknown, 1, 6, names)).toBeNull();
    view.destroy();
    unknown.destroy();
  });

  it('opens the same help from the keyboard at the cursor, and closes it when the cursor moves or on Escape', async () => {
    const names: NetlistNames = { ...NO_NAMES, uses: [used()] };
    // Beside the default keymap, as in the bench (its Mod-i and Escape must not take our keys).
    const view = new EditorView({ state: EditorState.create({ doc: NETLIST, extensions: [keymap.of(defaultKeymap), libraryHover(() => names, () => [])] }) });
    const source = blockHoverSource(() => names, () => []);
    const settle = () => new Promise((resolve) => setTimeout(resolve, 0));
    // The cursor just after `@3` on the use line.
    view.dispatch({ selection: { anchor: view.state.doc.line(2).to } });
    expect(openBlockHelpAtCursor(source)(view)).toBe(true);
    await settle();
    expect(keyboardHelpOpen(view.state)).toBe(true);
    view.dispatch({ selection: { anchor: view.state.doc.line(1).from } });
    expect(keyboardHelpOpen(view.state)).toBe(false);
    // Over a built-in part's kind there is nothing to show.
    view.dispatch({ selection: { anchor: view.state.doc.line(15).from + 5 } });
    openBlockHelpAtCursor(source)(view);
    await settle();
    expect(keyboardHelpOpen(view.state)).toBe(false);
    // The key itself, then Escape.
    view.dispatch({ selection: { anchor: view.state.doc.line(13).from + 5 } });
    view.contentDOM.dispatchEvent(new KeyboardEvent('keydown', { key: 'F2', bubbles: true }));
    await settle();
    expect(keyboardHelpOpen(view.state)).toBe(true);
    view.contentDOM.dispatchEvent(new KeyboardEvent('keydown', { key: 'Escape', bubbles: true }));
    expect(keyboardHelpOpen(view.state)).toBe(false);
    view.destroy();
  });

  it('is an editor extension that loads into a state', () => {
    const state = EditorState.create({ doc: NETLIST, extensions: [libraryHover(() => names, () => [])] });
    expect(state.doc.lines).toBe(17);
  });
});
