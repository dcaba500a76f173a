import { ChangeDetectionStrategy, Component, signal, viewChild } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { acceptCompletion, currentCompletions, startCompletion } from '@codemirror/autocomplete';
import { EditorView } from '@codemirror/view';
import type { LibraryEntry } from '../solver-protocol';
import { libraryCompletionsFor, versionOrder } from './library-completion';
import { NetlistEditor, type EditorDocument } from './netlist-editor';

// jsdom lays nothing out: give Range the measuring methods CodeMirror calls (empty answers).
beforeAll(() => {
  const empty = () => Object.assign([], { item: () => null }) as unknown as DOMRectList;
  Range.prototype.getClientRects ??= empty;
  Range.prototype.getBoundingClientRect ??= () => new DOMRect();
});

const LIBRARY: LibraryEntry[] = [
  { path: 'pairs/draft_pair', title: 'A pair still in draft', summary: '', versions: [{ version: 1, state: 'draft' }], origin: 'workspace' },
  { path: 'mirrors/old_npn', title: 'Retired mirror', summary: 'Kept for old netlists.', versions: [{ version: 1, state: 'retired' }], origin: 'workspace' },
  {
    path: 'mirrors/wilson_npn',
    title: 'Wilson npn current mirror',
    summary: 'Three transistors; output resistance about β·ro/2.',
    versions: [
      { version: 5, state: 'in_review' }, { version: 4, state: 'vetted' }, { version: 3, state: 'retired' }, { version: 2, state: 'vetted' }, { version: 1, state: 'retired' },
    ],
    origin: 'workspace',
  },
  { path: 'mirrors/simple_npn', title: 'Simple npn current mirror', summary: 'Two transistors.', versions: [{ version: 1, state: 'vetted' }], origin: 'seed' },
];

describe('libraryCompletionsFor', () => {
  it('offers paths after `use ` with title and summary, replacing what is typed of the path', () => {
    const all = libraryCompletionsFor('use ', LIBRARY)!;
    expect(all.typed).toBe(0);
    expect(all.options.map((o) => o.label).sort()).toEqual(['mirrors/old_npn', 'mirrors/simple_npn', 'mirrors/wilson_npn', 'pairs/draft_pair']);
    const wilson = all.options.find((o) => o.label === 'mirrors/wilson_npn')!;
    expect(wilson.detail).toBe('Wilson npn current mirror');
    expect(wilson.info).toBe('Three transistors; output resistance about β·ro/2.');
    expect(wilson.apply).toBe('mirrors/wilson_npn@');
    expect(libraryCompletionsFor('  use   mirrors/wi', LIBRARY)!.typed).toBe('mirrors/wi'.length);
    // Editing the path of a line that has its version already: no second `@`.
    expect(libraryCompletionsFor('use mirrors/', LIBRARY, 'wilson_npn@3')!.options[0].apply).not.toMatch(/@$/);
  });

  it('ranks blocks with a vetted version first and blocks with only retired versions last', () => {
    const boost = (path: string) => libraryCompletionsFor('use ', LIBRARY)!.options.find((o) => o.label === path)!.boost ?? 0;
    expect(boost('mirrors/wilson_npn')).toBeGreaterThan(boost('pairs/draft_pair'));
    expect(boost('mirrors/simple_npn')).toBeGreaterThan(boost('pairs/draft_pair'));
    expect(boost('pairs/draft_pair')).toBeGreaterThan(boost('mirrors/old_npn'));
  });

  it('offers versions after `use path@`: newest vetted first, the rest newest first, retired last and marked', () => {
    const found = libraryCompletionsFor('use mirrors/wilson_npn@', LIBRARY)!;
    expect(found.versionsOf).toBe('mirrors/wilson_npn');
    expect(found.typed).toBe(0);
    expect(found.options.map((o) => o.label)).toEqual(['4', '5', '2', '3', '1']);
    expect(found.options.map((o) => o.detail)).toEqual(['✓ vetted · newest vetted', '◔ in review', '✓ vetted', '⊘ retired', '⊘ retired']);
    const boosts = found.options.map((o) => o.boost!);
    expect(boosts).toEqual([...boosts].sort((a, b) => b - a));
    expect(new Set(boosts).size).toBe(boosts.length);
    expect(libraryCompletionsFor('use mirrors/wilson_npn@1', LIBRARY)!.typed).toBe(1);
  });

  it('orders versions without a vetted one newest first', () => {
    expect(versionOrder([{ version: 1, state: 'draft' }, { version: 3, state: 'retired' }, { version: 2, state: 'in_review' }]).map((v) => v.version)).toEqual([2, 1, 3]);
  });

  it('offers nothing off a `use` line, past the version, for an unknown path, or with an empty library', () => {
    expect(libraryCompletionsFor('use', LIBRARY)).toBeUndefined();
    expect(libraryCompletionsFor('q1: npn(', LIBRARY)).toBeUndefined();
    expect(libraryCompletionsFor('# use ', LIBRARY)).toBeUndefined();
    expect(libraryCompletionsFor('use mirrors/wilson_npn@4 ', LIBRARY)).toBeUndefined();
    expect(libraryCompletionsFor('use nowhere/none@', LIBRARY)).toBeUndefined();
    expect(libraryCompletionsFor('use ', [])).toBeUndefined();
  });
});

@Component({
  imports: [NetlistEditor],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `<nw-netlist-editor [document]="doc()" [library]="library()" (libraryVersionsWanted)="wanted.push($event)" />`,
})
class Host {
  readonly doc = signal<EditorDocument>({ key: 1, text: 'title Mirror\nuse \n' });
  readonly library = signal<LibraryEntry[]>(LIBRARY);
  readonly wanted: string[] = [];
  readonly editor = viewChild.required(NetlistEditor);
}

/** Waits (up to a second) until the open completion list satisfies `ready`. */
async function completions(view: EditorView, ready: (labels: string[]) => boolean): Promise<string[]> {
  for (let i = 0; i < 100; i++) {
    const labels = currentCompletions(view.state).map((c) => c.label);
    if (ready(labels)) return labels;
    await new Promise((r) => setTimeout(r, 10));
  }
  return currentCompletions(view.state).map((c) => c.label);
}

describe('NetlistEditor library completion', () => {
  async function mount() {
    const fixture = TestBed.createComponent(Host);
    await fixture.whenStable();
    const view = EditorView.findFromDOM((fixture.nativeElement as HTMLElement).querySelector('.cm-editor') as HTMLElement)!;
    return { fixture, host: fixture.componentInstance, view };
  }

  it('lists vetted blocks first after `use `, and picking one opens its versions, newest vetted on top', async () => {
    const { host, view } = await mount();
    view.dispatch({ selection: { anchor: view.state.doc.line(2).to } });
    startCompletion(view);
    const paths = await completions(view, (l) => l.length === 4);
    expect(paths.slice(0, 2).sort()).toEqual(['mirrors/simple_npn', 'mirrors/wilson_npn']);
    expect(paths.at(-1)).toBe('mirrors/old_npn');

    // Move to the Wilson mirror and take it: the line reads `use mirrors/wilson_npn@` and versions open.
    view.dispatch({ changes: { from: view.state.doc.line(2).to, insert: 'wil' }, selection: { anchor: view.state.doc.line(2).to + 3 }, userEvent: 'input.type' });
    await completions(view, (l) => l[0] === 'mirrors/wilson_npn');
    acceptCompletion(view);
    expect(view.state.doc.line(2).text).toBe('use mirrors/wilson_npn@');
    const versions = await completions(view, (l) => l.length === 5);
    expect(versions).toEqual(['4', '5', '2', '3', '1']);
    expect(host.wanted).toContain('mirrors/wilson_npn');
  });

  it('asks again when the full version list arrives while the versions are open', async () => {
    const { fixture, host, view } = await mount();
    const partial: LibraryEntry = { ...LIBRARY[2], versions: [{ version: 5, state: 'in_review' }, { version: 4, state: 'vetted' }] };
    host.library.set([partial]);
    await fixture.whenStable();
    view.dispatch({ changes: { from: view.state.doc.line(2).to, insert: 'mirrors/wilson_npn@' }, selection: { anchor: view.state.doc.line(2).to + 19 } });
    startCompletion(view);
    expect(await completions(view, (l) => l.length === 2)).toEqual(['4', '5']);
    host.library.set(LIBRARY);
    await fixture.whenStable();
    expect(await completions(view, (l) => l.length === 5)).toEqual(['4', '5', '2', '3', '1']);
  });
});
