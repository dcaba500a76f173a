import { TestBed } from '@angular/core/testing';
import { MatDialog } from '@angular/material/dialog';
import { provideRouter, Router } from '@angular/router';
import { ApplicationRef, Component } from '@angular/core';
import { SOLVER_WORKER_FACTORY, type WorkerLike } from '../bench/solver-client';
import { solveReply } from '../bench/solve-reply';
import type { SolveRequest, WorkerMessage } from '../bench/solver-protocol';
import { LibraryApi } from './library-api';
import { openProposeBlockDialog } from './propose-block-dialog';
import { FakeLibraryApi } from './testing/fake-library-api';

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

beforeAll(() => {
  const empty = () => Object.assign([], { item: () => null }) as unknown as DOMRectList;
  Range.prototype.getClientRects ??= empty;
  Range.prototype.getBoundingClientRect ??= () => new DOMRect();
});

describe('ProposeBlockDialog', () => {
  let api: FakeLibraryApi;
  vi.setConfig({ testTimeout: 30_000 });

  beforeEach(() => {
    api = new FakeLibraryApi();
    TestBed.configureTestingModule({
      providers: [
        provideRouter([{ path: '**', component: Blank }]),
        { provide: LibraryApi, useValue: api },
        { provide: SOLVER_WORKER_FACTORY, useValue: () => new SolvingWorker() },
      ],
    });
  });

  /** Lets the dialog's answers, the solver's replies and the rendering they cause land. */
  async function settle(): Promise<void> {
    for (let i = 0; i < 3; i++) {
      await new Promise((done) => setTimeout(done));
      await TestBed.inject(ApplicationRef).whenStable();
    }
  }

  function type(input: HTMLInputElement, text: string): void {
    input.value = text;
    input.dispatchEvent(new Event('input'));
  }

  const pane = () => document.querySelector('nw-propose-block-dialog') as HTMLElement;
  const propose = () => [...pane().querySelectorAll('button')].find((b) => b.textContent?.trim() === 'Propose') as HTMLButtonElement;

  it('proposes the documented template under the typed path and opens the new block’s page', async () => {
    const router = TestBed.inject(Router);
    const done = openProposeBlockDialog(TestBed.inject(MatDialog), router, { slug: 'strainlab' }, '/library');
    await settle();
    type(pane().querySelector('input[name="path"]') as HTMLInputElement, 'passives/half_r');
    type(pane().querySelector('input[name="tags"]') as HTMLInputElement, 'passive, divider');
    await settle();
    expect(pane().textContent).toContain('Fixture: 1 check, all pass.');
    propose().click();
    const created = await done;
    expect(created?.path).toBe('passives/half_r');
    const stored = api.blocks.get('passives/half_r')!.versions[0].source;
    expect(stored).toContain('block half_r(a, b)'); // the template followed the path
    expect(router.url).toBe('/library/passives/half_r/1');
  });

  it('keeps everything typed and says why when the path is refused', async () => {
    api.add('passives/half_r', { source: 'x' });
    const done = openProposeBlockDialog(TestBed.inject(MatDialog), TestBed.inject(Router), { slug: 'strainlab', source: 'block half_r(a, b)\n  r1: res(a, b) 1k\nend\n' });
    await settle();
    const path = pane().querySelector('input[name="path"]') as HTMLInputElement;
    type(path, 'Passives/half_r');
    propose().click();
    await settle();
    expect(pane().textContent).toContain('The category must start with a lower-case letter');
    type(path, 'passives/half_r');
    propose().click();
    await settle();
    expect(pane().querySelector('[role="alert"]')?.textContent).toContain('already exists');
    expect(path.value).toBe('passives/half_r');
    type(path, 'passives/other');
    propose().click();
    await settle();
    expect(pane().textContent).toContain('The source must define `block other(…)`');
    expect(api.blocks.has('passives/other')).toBe(false);
    (([...pane().querySelectorAll('button')].find((b) => b.textContent?.trim() === 'Cancel')) as HTMLButtonElement).click();
    expect(await done).toBeUndefined();
  });
});
