import { Component } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { provideRouter, Router } from '@angular/router';
import { EditorView } from '@codemirror/view';
import { RESISTOR_TAIL_PAIR } from '../bench/panels/testing/netlists';
import { SOLVER_WORKER_FACTORY, type WorkerLike } from '../bench/solver-client';
import { solveReply } from '../bench/solve-reply';
import type { SolveRequest, WorkerMessage } from '../bench/solver-protocol';
import { FakeTeamApi, error } from '../bench/team/testing/fake-team-api';
import { DRAFT_BACKEND, Drafts, MemoryDraftBackend } from '../core/drafts';
import { TeamApi, type SharedNetlist } from '../core/team-api';
import { SharedPage } from './shared-page';
import { SHARED_COPY } from './shared-text';

/** Solves with the real solver, as the worker would. */
class SolvingWorker implements WorkerLike {
  onmessage: ((event: MessageEvent<WorkerMessage>) => void) | null = null;
  onerror: ((event: ErrorEvent) => void) | null = null;
  postMessage(m: SolveRequest): void {
    const reply = solveReply(m.id, m.text);
    queueMicrotask(() => this.onmessage?.({ data: reply } as MessageEvent<WorkerMessage>));
  }
  terminate(): void {}
}

@Component({ template: '' })
class Blank {}

// jsdom lays nothing out: give Range the measuring methods CodeMirror calls (empty answers).
beforeAll(() => {
  const empty = () => Object.assign([], { item: () => null }) as unknown as DOMRectList;
  Range.prototype.getClientRects ??= empty;
  Range.prototype.getBoundingClientRect ??= () => new DOMRect();
});

const SHARED: SharedNetlist = {
  name: 'Resistor-tail pair',
  source: RESISTOR_TAIL_PAIR,
  version: 3,
  workspace: { name: 'Strainlab' },
  author: { name: 'Mei Tanaka' },
  revisionCreatedAt: '2026-03-12T09:00:00Z',
  sharedBy: { name: 'Mei Tanaka' },
  sharedAt: '2026-03-12T10:00:00Z',
  expiresAt: null,
  libraryPins: [],
  library: [],
};

describe('SharedPage', () => {
  let api: FakeTeamApi;

  beforeEach(() => {
    api = new FakeTeamApi();
    TestBed.configureTestingModule({
      providers: [
        provideRouter([{ path: 'bench', component: Blank }]),
        { provide: TeamApi, useValue: api },
        { provide: SOLVER_WORKER_FACTORY, useValue: () => new SolvingWorker() },
        { provide: DRAFT_BACKEND, useValue: new MemoryDraftBackend() },
      ],
    });
  });

  async function open(token = 'tok') {
    const fixture = TestBed.createComponent(SharedPage);
    fixture.componentRef.setInput('token', token);
    await fixture.whenStable();
    await new Promise((r) => setTimeout(r, 0));
    await fixture.whenStable();
    return { fixture, el: fixture.nativeElement as HTMLElement };
  }

  it('shows the shared version read-only with the bench panels, its results and the caution', async () => {
    api.sharedAnswer = SHARED;
    const { el } = await open();
    expect(el.querySelector('h1')?.textContent).toBe('Shared netlist: Resistor-tail pair');
    expect(el.querySelector('.meta')?.textContent).toMatch(/^v3 · from Strainlab · shared by Mei Tanaka on .* · does not expire$/);
    const content = el.querySelector('.cm-content') as HTMLElement;
    expect(content.getAttribute('contenteditable')).toBe('false');
    expect(content.getAttribute('aria-readonly')).toBe('true');
    const view = EditorView.findFromDOM(el.querySelector('.cm-editor') as HTMLElement)!;
    expect(view.state.readOnly).toBe(true);
    expect(view.state.doc.toString()).toBe(RESISTOR_TAIL_PAIR);
    expect(el.querySelector('nw-results-summary')?.textContent).toMatch(/check/);
    expect([...el.querySelectorAll('[role=tab]')].map((t) => t.textContent?.trim().split(/\s+/)[0])).toEqual(['Bias', 'Response', 'Modes', 'Checks', 'Other']);
    expect(el.querySelector('nw-cautions')?.textContent).toMatch(/First-order device models/);
  });

  it('opens a copy as a draft of my own and goes to the bench', async () => {
    api.sharedAnswer = SHARED;
    const { el, fixture } = await open();
    const button = [...el.querySelectorAll('button')].find((b) => b.textContent?.trim() === 'Open a copy in my bench')!;
    button.click();
    await fixture.whenStable();
    await new Promise((r) => setTimeout(r, 0));
    const drafts = TestBed.inject(Drafts);
    const last = await drafts.lastOpened();
    expect(last).toMatchObject({ text: RESISTOR_TAIL_PAIR, label: SHARED_COPY });
    expect(TestBed.inject(Router).url).toBe('/bench');
  });

  for (const [code, sentence] of [
    ['share_expired', 'This link has expired.'],
    ['share_revoked', 'This link was revoked by its author.'],
    ['share_not_found', 'There is no shared netlist at this address.'],
  ]) {
    it(`says “${sentence}” for ${code}`, async () => {
      api.sharedAnswer = error(404, code, 'x');
      const { el } = await open();
      expect(el.querySelector('.sentence')?.textContent).toBe(sentence);
      expect(el.querySelector('a[href="/bench"]')).not.toBeNull();
      expect(el.querySelector('.cm-editor')).toBeNull();
    });
  }

  it('says the server cannot be reached when offline, with a way to try again', async () => {
    api.online = false;
    const { el } = await open();
    expect(el.querySelector('.sentence')?.textContent).toMatch(/server cannot be reached/);
    expect([...el.querySelectorAll('button')].some((b) => b.textContent?.trim() === 'Try again')).toBe(true);
  });
});
