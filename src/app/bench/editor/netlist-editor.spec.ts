import { ChangeDetectionStrategy, Component, signal, viewChild } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { forEachDiagnostic } from '@codemirror/lint';
import { EditorView } from '@codemirror/view';
import type { Diagnostic } from '../../../../solver';
import type { NetlistNames } from '../solver-protocol';
import { completionsFor } from './completion';
import { rangeOf } from './diagnostics';
import { NetlistEditor, type EditorCommand, type EditorDocument, type RevealRequest } from './netlist-editor';
import { Text } from '@codemirror/state';

// jsdom lays nothing out: give Range the measuring methods CodeMirror calls (empty answers).
beforeAll(() => {
  const empty = () => Object.assign([], { item: () => null }) as unknown as DOMRectList;
  Range.prototype.getClientRects ??= empty;
  Range.prototype.getBoundingClientRect ??= () => new DOMRect();
});

@Component({
  imports: [NetlistEditor],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `<nw-netlist-editor [document]="doc()" [diagnostics]="diagnostics()" [reveal]="reveal()" label="Netlist editor"
    (textChange)="changes.push($event)" (command)="commands.push($event)" />`,
})
class Host {
  readonly doc = signal<EditorDocument>({ key: 1, text: 'title Pair\nrc1: res(vcc, outa) 8k\nq1: npn(c=outa, b=ina, e=tail) qn\n' });
  readonly diagnostics = signal<Diagnostic[]>([]);
  readonly reveal = signal<RevealRequest | undefined>(undefined);
  readonly changes: string[] = [];
  readonly commands: EditorCommand[] = [];
  readonly editor = viewChild.required(NetlistEditor);
}

async function mount() {
  const fixture = TestBed.createComponent(Host);
  await fixture.whenStable();
  const el = fixture.nativeElement as HTMLElement;
  const view = EditorView.findFromDOM(el.querySelector('.cm-editor') as HTMLElement)!;
  return { fixture, host: fixture.componentInstance, el, view };
}

describe('NetlistEditor', () => {
  it('makes the editable text the focus target of its scroller (axe: scrollable-region-focusable)', async () => {
    const { el } = await mount();
    const content = el.querySelector('.cm-scroller .cm-content') as HTMLElement;
    expect(content.getAttribute('contenteditable')).toBe('true');
    expect(content.getAttribute('tabindex')).toBe('0');
    expect(content.getAttribute('aria-label')).toBe('Netlist editor');
  });

  it('shows a read-only document that cannot be edited but can be reached from the keyboard', async () => {
    @Component({
      imports: [NetlistEditor],
      changeDetection: ChangeDetectionStrategy.OnPush,
      template: `<nw-netlist-editor [document]="{ key: 1, text: 'title Shared\\n' }" [readOnly]="true" label="Shared netlist" />`,
    })
    class ReadOnlyHost {}
    const fixture = TestBed.createComponent(ReadOnlyHost);
    await fixture.whenStable();
    const el = fixture.nativeElement as HTMLElement;
    const view = EditorView.findFromDOM(el.querySelector('.cm-editor') as HTMLElement)!;
    expect(view.state.readOnly).toBe(true);
    const content = el.querySelector('.cm-content') as HTMLElement;
    expect(content.getAttribute('contenteditable')).toBe('false');
    expect(content.getAttribute('tabindex')).toBe('0');
    expect(content.getAttribute('aria-label')).toBe('Shared netlist');
  });

  it('shows the document with line numbers and an accessible name', async () => {
    const { el, view } = await mount();
    expect(view.state.doc.toString()).toContain('q1: npn(c=outa');
    expect(el.querySelectorAll('.cm-lineNumbers .cm-gutterElement').length).toBeGreaterThanOrEqual(4);
    expect(el.querySelector('.cm-content')?.getAttribute('aria-label')).toBe('Netlist editor');
  });

  it('colours keywords, part kinds, pins and quantities', async () => {
    const { el } = await mount();
    const spans = [...el.querySelectorAll('.cm-line span')].map((s) => s.textContent);
    for (const token of ['title', 'res', 'npn', 'c', '8', 'k']) expect(spans).toContain(token);
  });

  it('emits every edit and undoes it', async () => {
    const { host, view } = await mount();
    view.dispatch({ changes: { from: view.state.doc.line(2).to - 2, to: view.state.doc.line(2).to, insert: '10k' } });
    expect(host.changes.at(-1)).toContain('rc1: res(vcc, outa) 10k');
    const { undo } = await import('@codemirror/commands');
    undo(view);
    expect(host.changes.at(-1)).toContain('rc1: res(vcc, outa) 8k');
  });

  it('marks a diagnostic on its line and column with its message and hint', async () => {
    const { fixture, host, view } = await mount();
    host.diagnostics.set([{ severity: 'error', code: 'unknown-model', line: 3, col: 32, message: 'No model named `qn`.', hint: 'did you mean `qp`?' }]);
    await fixture.whenStable();
    const found: { from: number; to: number; message: string }[] = [];
    forEachDiagnostic(view.state, (d, from, to) => found.push({ from, to, message: d.message }));
    expect(found).toHaveLength(1);
    const line3 = view.state.doc.line(3);
    expect(view.state.sliceDoc(found[0].from, found[0].to)).toBe('qn');
    expect(found[0].from).toBe(line3.from + 31);
    expect(found[0].message).toContain('did you mean `qp`?');
  });

  it('moves the cursor to a line asked for, again when asked twice', async () => {
    const { fixture, host, view } = await mount();
    host.reveal.set({ line: 3, seq: 1 });
    await fixture.whenStable();
    expect(view.state.doc.lineAt(view.state.selection.main.head).number).toBe(3);
    view.dispatch({ selection: { anchor: 0 } });
    host.reveal.set({ line: 3, seq: 2 });
    await fixture.whenStable();
    expect(view.state.doc.lineAt(view.state.selection.main.head).number).toBe(3);
  });

  it('replaces text and undo history when a new document arrives', async () => {
    const { fixture, host, view } = await mount();
    host.doc.set({ key: 2, text: 'title Other\n' });
    await fixture.whenStable();
    const current = EditorView.findFromDOM(fixture.nativeElement.querySelector('.cm-editor'))!;
    expect(current.state.doc.toString()).toBe('title Other\n');
    const { undoDepth } = await import('@codemirror/commands');
    expect(undoDepth(current.state)).toBe(0);
    expect(view).toBe(current);
  });
});

describe('rangeOf', () => {
  const doc = Text.of(['title X', 'q1: npn(c=a, b=b, e=c) qx', '']);
  it('uses endCol when given, else the word at the column', () => {
    expect(rangeOf(doc, { line: 2, col: 24, endCol: 26 })).toEqual({ from: 8 + 23, to: 8 + 25 });
    expect(rangeOf(doc, { line: 2, col: 5 })).toEqual({ from: 8 + 4, to: 8 + 7 });
  });
  it('never points outside the document, whatever the line and column', () => {
    const r = rangeOf(doc, { line: 99, col: 500 });
    expect(r.from).toBeGreaterThanOrEqual(0);
    expect(r.to).toBeLessThanOrEqual(doc.length);
  });
});

describe('completionsFor', () => {
  const names: NetlistNames = {
    models: [{ name: 'qn', kind: 'npn' }, { name: 'qp', kind: 'pnp' }, { name: 'mn', kind: 'nmos' }],
    blocks: [{ name: 'mirror2', pins: ['in', 'out', 'rail'], params: ['ratio'] }],
    params: ['rc'],
    parts: [{ name: 'q1', kind: 'npn' }, { name: 'va', kind: 'vsrc' }, { name: 'rc1', kind: 'res' }],
    nodes: ['vcc', 'outa', 'tail', 'm1.x'],
    measures: ['a0'],
    uses: [],
  };
  const labels = (before: string) => (completionsFor(before, names) ?? []).map((c) => c.label);

  it('offers statements at the start of a line', () => {
    expect(labels('')).toEqual(expect.arrayContaining(['title', 'param', 'model', 'analyze', 'ports', 'measure', 'check']));
  });
  it('offers part kinds and blocks after `name:`', () => {
    expect(labels('q3: ')).toEqual(expect.arrayContaining(['npn', 'pnp', 'nmos', 'res', 'vsrc', 'mirror2']));
  });
  it('offers the pins not yet given, per kind', () => {
    expect(labels('q3: npn(')).toEqual(['c=', 'b=', 'e=']);
    expect(labels('q3: npn(c=outa, ')).toEqual(['b=', 'e=']);
    expect(labels('m1: nmos(')).toEqual(['d=', 'g=', 's=', 'b=']);
    expect(labels('d1: diode(')).toEqual(['a=', 'k=']);
    expect(labels('x1: mirror2(in=a, ')).toEqual(['out=', 'rail=']);
  });
  it('offers nodes (with gnd, without inner dotted nodes) after a pin', () => {
    expect(labels('q3: npn(c=')).toEqual(['gnd', 'vcc', 'outa', 'tail']);
  });
  it('offers models of the right family after a transistor, and block params after a block', () => {
    const after = labels('q3: npn(c=a, b=b, e=c) ');
    expect(after).toContain('qn');
    expect(after).toContain('qp');
    expect(after).not.toContain('mn');
    expect(after).toContain('area=');
    expect(labels('x1: mirror2(in=a, out=b, rail=c) ')).toEqual(['ratio=']);
  });
  it('offers model keys inside a model line', () => {
    expect(labels('model qz: npn(is=1e-16, ')).toEqual(expect.arrayContaining(['beta=', 'va=', 'cje=', 'tauf=']));
    expect(labels('model mz: nmos(')).toEqual(expect.arrayContaining(['ucox=', 'vth=', 'lambda=']));
  });
  it('offers functions and figures in measures; the right parts inside a call', () => {
    expect(labels('measure a1 = ')).toEqual(expect.arrayContaining(['db', 'corner', 'adm', 'cmrr_db', 'a0', 'rc']));
    expect(labels('check ic(')).toEqual(['q1']);
    expect(labels('measure z = zin(')).toEqual(['va']);
    expect(labels('check v(')).toEqual(['gnd', 'vcc', 'outa', 'tail']);
  });
  it('offers nothing inside a comment or a title', () => {
    expect(completionsFor('q1: npn(c=a) # c', names)).toBeUndefined();
    expect(completionsFor('title My ', names)).toBeUndefined();
  });
});
