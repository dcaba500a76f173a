import { TestBed } from '@angular/core/testing';
import type { Diagnostic, SolveResult } from '../../../solver';
import { DRAFT_BACKEND, DRAFT_STASH, Drafts, MemoryDraftBackend, MemoryStash, STASH_KEY } from '../core/drafts';
import { AUTOSAVE_MS, BenchStore, MAX_FILE_BYTES, slug } from './bench-store';
import { EXAMPLES } from './examples';
import { SOLVER_WORKER_FACTORY, SolverClient, type WorkerLike } from './solver-client';
import { NO_NAMES, type SolveReply, type SolveRequest, type WorkerMessage } from './solver-protocol';

/**
 * A worker that answers at once, titling the result by its text: a circuit error (no operating
 * point) when the text contains `ERR`, a request error (operating point kept) when it has `REQ`.
 */
class EchoWorker implements WorkerLike {
  onmessage: ((event: MessageEvent<WorkerMessage>) => void) | null = null;
  onerror: ((event: ErrorEvent) => void) | null = null;
  postMessage(m: SolveRequest): void {
    const errors: Diagnostic[] = /ERR|REQ/.test(m.text) ? [{ severity: 'error', code: 'syntax', line: 1, col: 1, message: 'bad' }] : [];
    const op = m.text.includes('ERR') ? undefined : { nodes: {}, sources: {}, parts: {}, devices: {} };
    const result = { title: m.text, temp_c: 27, op, measures: {}, checks: [], warnings: [], errors } as SolveResult;
    // Its one check line carries the text, so a test can tell which text's lines are shown.
    const reply: SolveReply = { type: 'solved', id: m.id, result, text: m.text, names: NO_NAMES, lines: { measures: [], checks: [{ line: 1, expression: m.text }], analyses: [] }, solveMs: 1 };
    queueMicrotask(() => this.onmessage?.({ data: reply } as MessageEvent<WorkerMessage>));
  }
  terminate(): void {}
}

describe('BenchStore', () => {
  let store: BenchStore;
  let drafts: Drafts;
  let backend: MemoryDraftBackend;
  let stash: MemoryStash;

  function configure(): void {
    TestBed.configureTestingModule({
      providers: [BenchStore, SolverClient, { provide: SOLVER_WORKER_FACTORY, useValue: () => new EchoWorker() },
        { provide: DRAFT_BACKEND, useValue: backend }, { provide: DRAFT_STASH, useValue: stash }],
    });
    store = TestBed.inject(BenchStore);
    drafts = TestBed.inject(Drafts);
  }

  beforeEach(() => {
    backend = new MemoryDraftBackend();
    stash = new MemoryStash();
    configure();
  });

  async function solved(text: string): Promise<void> {
    store.edit(text);
    store.solveNow();
    await Promise.resolve();
    await Promise.resolve();
  }

  it('shows the newest result whenever its circuit solved, and the last that solved (stale) when it did not', async () => {
    await solved('good one');
    expect(store.shown()?.title).toBe('good one');
    expect(store.stale()).toBe(false);
    // A broken request line: the circuit still solved, so its results are the ones shown.
    await solved('new value, REQ broken measure');
    expect(store.shown()?.title).toBe('new value, REQ broken measure');
    expect(store.stale()).toBe(false);
    await solved('good two');
    await solved('half-typed ERR');
    expect(store.shown()?.title).toBe('good two');
    expect(store.shownLines().checks[0].expression).toBe('good two');
    expect(store.stale()).toBe(true);
    expect(store.staleReason()).toBe('circuit');
    expect(store.diagnostics()).toHaveLength(1);
    await solved('good three');
    expect(store.shown()?.title).toBe('good three');
    expect(store.stale()).toBe(false);
  });

  it('does not carry a clean result over to another netlist', async () => {
    await solved('good one');
    await store.openFile(new File(['ERR from the start'], 'bad.nwl'));
    await Promise.resolve();
    await Promise.resolve();
    expect(store.shown()?.title).toBe('ERR from the start');
    expect(store.stale()).toBe(false);
  });

  it('autosaves an edit into a new draft, then into the same draft', async () => {
    vi.useFakeTimers();
    try {
      await store.openExample(EXAMPLES[0]);
      expect(store.saveState()).toBe('saved');
      store.edit('title First\n');
      expect(store.saveState()).toBe('unsaved');
      await vi.advanceTimersByTimeAsync(AUTOSAVE_MS + 10);
      expect(store.saveState()).toBe('saved');
      const id = store.draftId();
      expect(id).toBeDefined();
      store.edit('title Second\n');
      await vi.advanceTimersByTimeAsync(AUTOSAVE_MS + 10);
      expect(store.draftId()).toBe(id);
      expect(drafts.list().map((d) => d.title)).toEqual(['Second']);
    } finally {
      vi.useRealTimers();
    }
  });

  it('writes the draft at once when the page is hidden, without waiting for the autosave', async () => {
    await store.openExample(EXAMPLES[0]);
    store.edit('title Hidden at once\n');
    Object.defineProperty(document, 'visibilityState', { value: 'hidden', configurable: true });
    try {
      document.dispatchEvent(new Event('visibilitychange'));
      await vi.waitFor(async () => expect((await drafts.refresh()).map((d) => d.title)).toEqual(['Hidden at once']));
      expect(store.saveState()).toBe('saved');
    } finally {
      delete (document as { visibilityState?: string }).visibilityState;
    }
  });

  it('keeps the newest text in the stash synchronously; a reload right after typing restores it, in one draft', async () => {
    await store.restore(EXAMPLES[0]);
    store.edit('title Typed just before the reload\n');
    expect(JSON.parse([...stash.items.values()][0]).text).toBe('title Typed just before the reload\n');
    expect(await backend.all()).toEqual([]);
    // The page goes away: its last write lands, but not the removal of the stash.
    TestBed.resetTestingModule();
    await vi.waitFor(async () => expect(await backend.all()).toHaveLength(1));
    stash.setItem(STASH_KEY, JSON.stringify({ text: 'title Typed just before the reload\n' }));
    configure();
    await store.restore(EXAMPLES[0]);
    expect(store.source()).toBe('title Typed just before the reload\n');
    expect(store.draftId()).toBeDefined();
    const all = await backend.all();
    expect(all.map((d) => d.text)).toEqual(['title Typed just before the reload\n']);
    expect(stash.items.size).toBe(0);
  });

  it('empties the stash once the draft holds the text', async () => {
    await store.openExample(EXAMPLES[0]);
    store.edit('title Saved\n');
    expect(stash.items.size).toBe(1);
    await store.saveNow();
    expect(stash.items.size).toBe(0);
  });

  it('leaves no draft behind for an example that was only looked at; Ctrl-S makes one', async () => {
    await store.openExample(EXAMPLES[0]);
    await store.openExample(EXAMPLES[2]);
    await drafts.refresh();
    expect(drafts.list()).toEqual([]);
    await store.saveNow();
    expect(drafts.list().map((d) => d.title)).toEqual([EXAMPLES[2].text.split('\n')[0].replace(/^title\s+/, '')]);
  });

  it('opens a text file as a new draft and refuses what is not a netlist', async () => {
    expect(await store.openFile(new File(['title From disk\r\nq1: res(a, gnd) 1k\r\n'], 'pair.nwl'))).toBeUndefined();
    expect(store.source()).toBe('title From disk\nq1: res(a, gnd) 1k\n');
    expect(store.fileName()).toBe('pair.nwl');
    expect(drafts.list()[0].fileName).toBe('pair.nwl');
    expect(await store.openFile(new File([new Uint8Array(MAX_FILE_BYTES + 1)], 'big.nwl'))).toMatch(/MB/);
    expect(await store.openFile(new File([new Uint8Array([0x50, 0x4b, 0x03, 0x04, 0])], 'a.zip', { type: 'application/zip' }))).toMatch(/not a text file/);
    expect(store.source()).toBe('title From disk\nq1: res(a, gnd) 1k\n');
  });

  it('downloads under the file name it came from, else a name made from its title', async () => {
    await store.openExample(EXAMPLES[0]);
    expect(store.download().name).toBe(`${slug(store.title())}.nwl`);
    expect(slug('Strainlab front end, step 1: resistor-tail pair')).toBe('strainlab-front-end-step-1-resistor-tail-pair');
    await store.openFile(new File(['title x\n'], 'bridge.txt'));
    expect(store.download().name).toBe('bridge.nwl');
    expect(await store.download().blob.text()).toBe('title x\n');
  });

  it('asks the editor for a line again even when it is the same line', () => {
    store.selectLine(12);
    const first = store.reveal();
    store.selectLine(12);
    expect(store.reveal()?.line).toBe(12);
    expect(store.reveal()?.seq).not.toBe(first?.seq);
  });
});
