import { ChangeDetectionStrategy, Component } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { provideRouter, RouterOutlet, withComponentInputBinding } from '@angular/router';
import { RouterTestingHarness } from '@angular/router/testing';
import { EditorView } from '@codemirror/view';
import { solveNetlist } from '../../../solver';
import { SOLVER_WORKER_FACTORY, type WorkerLike } from '../bench/solver-client';
import { solveReply } from '../bench/solve-reply';
import type { SolveRequest, WorkerMessage } from '../bench/solver-protocol';
import { Session } from '../core/session';
import type { Role } from '../core/team-api';
import { outcomesOf } from './check-compare';
import { LibraryApi, type CheckOutcome } from './library-api';
import { LIBRARY_ROUTES } from './library.routes';
import { ADA, FakeLibraryApi, MEI } from './testing/fake-library-api';

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

/** A page around the library with a component of its own, so `:slug` is not passed down. */
@Component({ imports: [RouterOutlet], changeDetection: ChangeDetectionStrategy.OnPush, template: '<router-outlet />' })
class Shell {}

@Component({ template: '' })
class Blank {}

// jsdom lays nothing out: give Range the measuring methods CodeMirror calls (empty answers).
beforeAll(() => {
  const empty = () => Object.assign([], { item: () => null }) as unknown as DOMRectList;
  Range.prototype.getClientRects ??= empty;
  Range.prototype.getBoundingClientRect ??= () => new DOMRect();
});

/** A documented divider with a fixture: 2 V over two equal resistors, 1 V at the tap (Ohm's law). */
const DIVIDER = `#: Resistive divider
#: Halves the voltage between top and bot.
#: pin top — upper end
#: pin mid — the tap
#: pin bot — lower end
block divider(top, mid, bot)
  ra: res(top, mid) 10k
  rb: res(mid, bot) 10k
end
vs: vsrc(in, gnd) 2
d1: divider(top=in, mid=out, bot=gnd)
measure vout = v(out)
check vout = 1 ± 0.1%
check vout >= 0.5
`;
const PINS = [{ name: 'top', doc: 'upper end' }, { name: 'mid', doc: 'the tap' }, { name: 'bot', doc: 'lower end' }];
const lineOf = (text: string, start: string) => text.split('\n').findIndex((l) => l.startsWith(start)) + 1;
/** What the author's browser sent: the real solver's checks, through JSON. */
const authorChecks = (source = DIVIDER): CheckOutcome[] => JSON.parse(JSON.stringify(outcomesOf(solveNetlist(source).checks)));

describe('BlockPage', () => {
  let api: FakeLibraryApi;
  // The first page opened loads its lazy chunks and CodeMirror: slow on a busy machine, not a speed test.
  vi.setConfig({ testTimeout: 30_000 });

  beforeEach(() => {
    api = new FakeLibraryApi();
    TestBed.configureTestingModule({
      providers: [
        provideRouter([
          { path: 'library', children: LIBRARY_ROUTES },
          { path: 'w/:slug', component: Shell, children: [{ path: 'library', children: LIBRARY_ROUTES }] },
          { path: 'bench', component: Blank },
        ], withComponentInputBinding()),
        { provide: LibraryApi, useValue: api },
        { provide: SOLVER_WORKER_FACTORY, useValue: () => new SolvingWorker() },
      ],
    });
  });

  /** Opens `url` as a member of Strainlab (with `role`) and of another workspace, listed first when `otherFirst`. */
  async function open(url: string, role: Role = 'reviewer', otherFirst = false) {
    api.role = role;
    const session = TestBed.inject(Session);
    const mine = { slug: 'strainlab', name: 'Strainlab', role };
    const other = { slug: 'other', name: 'Other lab', role: 'viewer' as Role };
    session.me.set({ user: api.me, workspaces: otherFirst ? [other, mine] : [mine, other] });
    session.state.set('signed-in');
    const harness = await RouterTestingHarness.create();
    await harness.navigateByUrl(url);
    await settle(harness);
    return { harness, el: harness.fixture.nativeElement as HTMLElement };
  }

  async function settle(harness: RouterTestingHarness): Promise<void> {
    for (let i = 0; i < 3; i++) {
      await new Promise((done) => setTimeout(done));
      await harness.fixture.whenStable();
    }
  }

  const button = (el: HTMLElement, words: string) => [...el.querySelectorAll('button')].find((b) => b.textContent?.trim().startsWith(words)) as HTMLButtonElement;

  it('shows the newest version with its docs, its review notes on their lines, and checks re-solved here that agree', async () => {
    const commentLine = lineOf(DIVIDER, '  ra:');
    api.add('passives/divider', {
      source: DIVIDER, state: 'vetted', submitted: true, checks: authorChecks(), pins: PINS,
      reviews: [{ author: MEI, kind: 'comment', comment: 'Why 10k?', line: commentLine, createdAt: '2026-03-12T10:00:00Z' }],
    }, 'Resistive divider');
    const { el } = await open('/w/strainlab/library/passives/divider', 'reviewer', true);
    expect(api.slugsRead).toEqual(['strainlab']); // from the address, though "other" would be the current one
    expect(el.querySelector('h1')?.textContent).toContain('passives/divider');
    expect(el.querySelector('h1 nw-state-chip')?.textContent?.trim()).toContain('v1 · Vetted');
    expect(el.querySelector('nw-block-pins')?.textContent).toContain('the tap');
    const mark = el.querySelector('.nw-note-mark') as HTMLElement;
    expect(mark.textContent).toBe('1');
    expect(mark.title).toBe('Mei Tanaka: Why 10k?');
    expect(el.querySelector('nw-review-thread')?.textContent?.replace(/\s+/g, ' ')).toContain(`Mei Tanaka commented on line ${commentLine}`);
    const checks = el.querySelector('nw-block-checks') as HTMLElement;
    expect(checks.querySelector('.summary')?.textContent).toContain('all 2 the same');
    expect(checks.querySelectorAll('tr.mismatch')).toHaveLength(0);
    expect(el.textContent).toContain('First-order device models');
    const bench = [...el.querySelectorAll('a')].find((a) => a.textContent?.trim() === 'Open in bench') as HTMLAnchorElement;
    expect(decodeURIComponent(bench.getAttribute('href') ?? '')).toBe('/bench?block=passives/divider@1');
  });

  it('flags a check whose value here differs from the author’s', async () => {
    const checks = authorChecks();
    checks[0].value = 1.2;
    api.add('passives/divider', { source: DIVIDER, state: 'in_review', submitted: true, checks, pins: PINS });
    const { el } = await open('/library/passives/divider/1');
    const table = el.querySelector('nw-block-checks') as HTMLElement;
    expect(table.querySelector('.summary')?.textContent).toContain('1 mismatch');
    const flagged = table.querySelectorAll('tr.mismatch');
    expect(flagged).toHaveLength(1);
    expect(flagged[0].textContent).toContain('1.2 for the author');
    expect(flagged[0].querySelector('button.line')?.textContent).toBe(String(lineOf(DIVIDER, 'check vout = 1')));
  });

  it('lets its author submit a draft with the checks solved in this browser', async () => {
    api.add('passives/divider', { source: DIVIDER, author: ADA, pins: PINS });
    const { harness, el } = await open('/library/passives/divider/1', 'designer');
    expect(el.querySelector('nw-block-checks .summary')?.textContent).toContain('not submitted');
    button(el, 'Submit v1').click();
    await settle(harness);
    expect(api.submits).toHaveLength(1);
    expect(api.submits[0].checks).toEqual(authorChecks());
    expect(el.querySelector('h1 nw-state-chip')?.textContent).toContain('In review');
  });

  it('refuses to submit while the source has errors, and says where', async () => {
    const broken = DIVIDER.replace('ra: res(top, mid) 10k', 'ra: resistor(top, mid) 10k');
    api.add('passives/divider', { source: broken, author: ADA, pins: PINS });
    const { harness, el } = await open('/library/passives/divider/1', 'designer');
    button(el, 'Submit v1').click();
    await settle(harness);
    expect(api.submits).toEqual([]);
    const problem = el.querySelector('.submit .problem')?.textContent ?? '';
    expect(problem).toContain(`line ${lineOf(broken, '  ra:')}`);
    expect(problem).toContain('submitted only when it solves');
  });

  it('needs a reason to send back, takes a line from the source’s line numbers, and approves', async () => {
    api.add('passives/divider', { source: DIVIDER, state: 'in_review', submitted: true, checks: authorChecks(), pins: PINS });
    const { harness, el } = await open('/library/passives/divider/1');
    button(el, 'Send back').click();
    await settle(harness);
    expect(el.querySelector('nw-review-box .problem')?.textContent).toContain('Say why it goes back');
    expect(api.reviewsSent).toEqual([]);

    const numbers = [...el.querySelectorAll('.cm-lineNumbers .cm-gutterElement')].filter((g) => g.textContent === '7');
    expect(numbers).toHaveLength(1);
    (numbers[0] as HTMLElement).click();
    await settle(harness);
    const lineField = el.querySelector('nw-review-box input[type="number"]') as HTMLInputElement;
    expect(lineField.value).toBe('7');
    const words = el.querySelectorAll('nw-review-box input')[1] as HTMLInputElement;
    words.value = 'Use 1% parts.';
    words.dispatchEvent(new Event('input'));
    button(el, 'Send back').click();
    await settle(harness);
    expect(api.reviewsSent.map((r) => r.body)).toEqual([{ decision: 'send_back', comments: [{ line: 7, text: 'Use 1% parts.' }] }]);
    expect(el.querySelector('h1 nw-state-chip')?.textContent).toContain('Draft');
    expect(el.querySelector('.nw-note-mark')?.textContent).toBe('1');
  });

  it('approves a version in review', async () => {
    api.add('passives/divider', { source: DIVIDER, state: 'in_review', submitted: true, checks: authorChecks(), pins: PINS });
    const { harness, el } = await open('/library/passives/divider/1');
    button(el, 'Approve').click();
    await settle(harness);
    expect(api.reviewsSent.map((r) => r.body.decision)).toEqual(['approve']);
    expect(el.querySelector('h1 nw-state-chip')?.textContent).toContain('Vetted');
  });

  it('copies the use line and an instance line with every pin', async () => {
    const writeText = vi.fn(async (_: string) => undefined);
    Object.defineProperty(navigator, 'clipboard', { value: { writeText }, configurable: true });
    api.add('passives/divider', { source: DIVIDER, state: 'vetted', submitted: true, checks: authorChecks(), pins: PINS });
    const { harness, el } = await open('/library/passives/divider/1', 'viewer');
    button(el, 'Use in my netlist').click();
    await settle(harness);
    expect(writeText).toHaveBeenCalledWith('use passives/divider@1\nx1: divider(top=…, mid=…, bot=…)\n');
    expect(document.body.textContent).toContain('Copied “use passives/divider@1”');
    expect(el.querySelector('nw-review-box')).toBeNull(); // a viewer neither reviews nor comments
  });

  it('lets its author edit a draft never submitted and save it', async () => {
    api.add('passives/divider', { source: DIVIDER, author: ADA, pins: PINS });
    const { harness, el } = await open('/library/passives/divider/1', 'designer');
    button(el, 'Edit draft').click();
    await settle(harness);
    const view = EditorView.findFromDOM(el.querySelector('nw-block-editor .cm-editor') as HTMLElement)!;
    view.dispatch({ changes: { from: view.state.doc.length, insert: 'check vout <= 1.2\n' } });
    await settle(harness);
    expect(el.querySelector('nw-block-editor .status')?.textContent).toContain('Fixture: 3 checks, all pass.');
    button(el, 'Save draft').click();
    await settle(harness);
    expect(api.blocks.get('passives/divider')!.versions[0].source).toBe(`${DIVIDER}check vout <= 1.2\n`);
    expect(el.querySelector('nw-block-editor')).toBeNull();
    expect(el.querySelectorAll('nw-block-checks tbody tr')).toHaveLength(3);
  });

  it('lets an admin retire a vetted version once confirmed', async () => {
    api.add('passives/divider', { source: DIVIDER, state: 'vetted', submitted: true, checks: authorChecks(), pins: PINS });
    const { harness, el } = await open('/library/passives/divider/1', 'admin');
    button(el, 'Retire').click();
    await settle(harness);
    const confirm = document.querySelector('nw-confirm-dialog button.confirm') as HTMLButtonElement;
    expect(document.querySelector('nw-confirm-dialog')?.textContent).toContain('netlists that pin it still solve');
    confirm.click();
    await new Promise((done) => setTimeout(done, 500)); // the dialog closes after its exit animation
    await settle(harness);
    expect(el.querySelector('h1 nw-state-chip')?.textContent).toContain('Retired');
    expect(button(el, 'Retire')).toBeUndefined();
  });

  it('says so when the address names a version that does not exist', async () => {
    api.add('passives/divider', { source: DIVIDER });
    const { el } = await open('/library/passives/divider/9');
    expect(el.querySelector('.problem')?.textContent).toContain('has no version 9');
  });
});
