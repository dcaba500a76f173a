import { TestBed } from '@angular/core/testing';
import type { SolveResult } from '../../../../solver';
import { DRAFT_BACKEND, Drafts, MemoryDraftBackend } from '../../core/drafts';
import { Session } from '../../core/session';
import { TeamApi } from '../../core/team-api';
import { BenchStore } from '../bench-store';
import { SOLVER_WORKER_FACTORY, SolverClient, type WorkerLike } from '../solver-client';
import { NO_LINES, NO_NAMES, type SolveRequest, type WorkerMessage } from '../solver-protocol';
import { BEFORE_CONFLICT, RETRY_MS, TeamSync } from './team-sync';
import { FakeTeamApi } from './testing/fake-team-api';

class QuietWorker implements WorkerLike {
  onmessage: ((event: MessageEvent<WorkerMessage>) => void) | null = null;
  onerror: ((event: ErrorEvent) => void) | null = null;
  postMessage(m: SolveRequest): void {
    const result = { title: '', temp_c: 27, measures: {}, checks: [], warnings: [], errors: [] } as unknown as SolveResult;
    queueMicrotask(() => this.onmessage?.({ data: { type: 'solved', id: m.id, result, text: m.text, names: NO_NAMES, lines: NO_LINES, solveMs: 1 } } as MessageEvent<WorkerMessage>));
  }
  terminate(): void {}
}

const CORE = 'title Bias core\nr1: res(a, gnd) 1k\n';

describe('TeamSync (the bench saving to the team server)', () => {
  let api: FakeTeamApi;
  let backend: MemoryDraftBackend;
  let store: BenchStore;
  let team: TeamSync;
  let drafts: Drafts;

  beforeEach(async () => {
    api = new FakeTeamApi();
    backend = new MemoryDraftBackend();
    TestBed.configureTestingModule({
      providers: [
        BenchStore,
        SolverClient,
        TeamSync,
        { provide: TeamApi, useValue: api },
        { provide: SOLVER_WORKER_FACTORY, useValue: () => new QuietWorker() },
        { provide: DRAFT_BACKEND, useValue: backend },
      ],
    });
    store = TestBed.inject(BenchStore);
    team = TestBed.inject(TeamSync);
    drafts = TestBed.inject(Drafts);
    await TestBed.inject(Session).load();
  });

  async function typed(text: string): Promise<void> {
    store.edit(text);
    await store.saveNow();
  }

  it('opens a team netlist into a draft linked to it, and reopens the same draft later', async () => {
    const n = api.seed('Bias core', CORE);
    expect(await team.open(n.id)).toEqual({ opened: true });
    expect(store.source()).toBe(CORE);
    expect(store.remote()).toEqual({ netlistId: n.id, workspace: 'strainlab', name: 'Bias core', baseVersion: 1, savedText: CORE });
    expect(team.status().text).toBe('Saved to team · v1');
    const id = store.draftId();
    expect((await backend.get(id!))?.remote?.baseVersion).toBe(1);

    await team.open(n.id);
    expect(store.draftId()).toBe(id);
    expect((await drafts.refresh()).length).toBe(1);
  });

  it('brings an untouched draft up to date, but keeps a draft with changes as it is', async () => {
    const n = api.seed('Bias core', CORE);
    await team.open(n.id);
    api.saveAs(n.id, `${CORE}r2: res(a, b) 2k\n`);
    expect((await team.open(n.id)).message).toMatch(/up to date with team v2/);
    expect(store.source()).toContain('r2:');
    expect(store.remote()?.baseVersion).toBe(2);

    await typed(`${store.source()}# mine\n`);
    api.saveAs(n.id, `${CORE}r3: res(a, b) 3k\n`);
    const again = await team.open(n.id);
    expect(again.message).toMatch(/based on team v2; the team copy is now v3/);
    expect(store.source()).toContain('# mine');
    expect(store.remote()?.baseVersion).toBe(2);
    expect(team.status().text).toBe('Unsaved changes (team v2)');
  });

  it('opens the copy kept in this browser when the server cannot be reached', async () => {
    const n = api.seed('Bias core', CORE);
    await team.open(n.id);
    await team.open('elsewhere'); // not found: nothing opened
    api.online = false;
    const out = await team.open(n.id);
    expect(out.opened).toBe(true);
    expect(out.message).toMatch(/cannot be reached; this is your copy kept in this browser \(team v1\)/);
    expect(await team.open('n99')).toMatchObject({ opened: false, message: expect.stringMatching(/cannot be reached/), signIn: false });
  });

  it('saves to the team only when the text differs from its base version, then moves the base', async () => {
    const n = api.seed('Bias core', CORE);
    await team.open(n.id);
    expect(await team.push()).toEqual({ kind: 'unchanged', version: 1 });
    expect(api.puts).toEqual([]);

    await typed(`${CORE}c1: cap(a, gnd) 1p\n`);
    expect(team.status().text).toBe('Unsaved changes (team v1)');
    expect(await team.push()).toEqual({ kind: 'saved', version: 2 });
    expect(api.puts).toEqual([{ id: n.id, source: `${CORE}c1: cap(a, gnd) 1p\n`, baseVersion: 1 }]);
    expect(store.remote()).toMatchObject({ baseVersion: 2, savedText: store.source() });
    expect(team.status().text).toBe('Saved to team · v2');
    expect((await backend.get(store.draftId()!))?.remote?.baseVersion).toBe(2);
  });

  it('on a stale base version reports the conflict and changes nothing', async () => {
    const n = api.seed('Bias core', CORE);
    await team.open(n.id);
    api.saveAs(n.id, `${CORE}# theirs\n`);
    await typed(`${CORE}# mine\n`);
    const out = await team.push();
    expect(out).toMatchObject({ kind: 'conflict', current: { version: 2, source: `${CORE}# theirs\n`, author: { name: 'Mei Tanaka' } } });
    expect(store.source()).toBe(`${CORE}# mine\n`);
    expect(store.remote()?.baseVersion).toBe(1);
    expect(team.status().text).toBe('Not saved to team: the team copy changed (now v2) — Save to compare');
    expect(api.puts).toEqual([]);
  });

  it('"Keep mine" saves my text on top of the team version I was shown', async () => {
    const n = api.seed('Bias core', CORE);
    await team.open(n.id);
    api.saveAs(n.id, `${CORE}# theirs\n`);
    await typed(`${CORE}# mine\n`);
    const out = await team.push();
    if (out.kind !== 'conflict') throw new Error('expected a conflict');
    expect(await team.resolve({ action: 'keep-mine', mine: store.source() }, out.current)).toEqual({ kind: 'saved', version: 3 });
    expect(api.puts.at(-1)).toEqual({ id: n.id, source: `${CORE}# mine\n`, baseVersion: 2 });
    expect(team.status().text).toBe('Saved to team · v3');
  });

  it('"Save merged" saves the edited text; a second conflict meanwhile is reported with the newer copy', async () => {
    const n = api.seed('Bias core', CORE);
    await team.open(n.id);
    api.saveAs(n.id, `${CORE}# theirs\n`);
    await typed(`${CORE}# mine\n`);
    const first = await team.push();
    if (first.kind !== 'conflict') throw new Error('expected a conflict');
    api.saveAs(n.id, `${CORE}# theirs, again\n`);
    const merged = `${CORE}# theirs\n# mine\n`;
    const second = await team.resolve({ action: 'save-merged', merged }, first.current);
    expect(second).toMatchObject({ kind: 'conflict', current: { version: 3 } });
    expect(store.source()).toBe(merged); // the merge is kept in the bench and its draft
    expect((await backend.get(store.draftId()!))?.text).toBe(merged);
    if (second.kind !== 'conflict') return;
    expect(await team.resolve({ action: 'save-merged', merged }, second.current)).toEqual({ kind: 'saved', version: 4 });
    expect(api.puts.at(-1)).toEqual({ id: n.id, source: merged, baseVersion: 3 });
  });

  it('"Take the team\'s" shows the team copy and first keeps my text as a separate draft', async () => {
    const n = api.seed('Bias core', CORE);
    await team.open(n.id);
    const linkedId = store.draftId();
    api.saveAs(n.id, `${CORE}# theirs\n`);
    await typed(`${CORE}# mine\n`);
    const out = await team.push();
    if (out.kind !== 'conflict') throw new Error('expected a conflict');
    await team.resolve({ action: 'take-theirs', mine: store.source(), edited: store.source() }, out.current);
    expect(store.source()).toBe(`${CORE}# theirs\n`);
    expect(store.remote()).toMatchObject({ baseVersion: 2, savedText: `${CORE}# theirs\n` });
    expect(store.draftId()).toBe(linkedId);
    const all = await drafts.refresh();
    const copy = all.find((d) => d.label === BEFORE_CONFLICT);
    expect(copy).toMatchObject({ text: `${CORE}# mine\n`, title: `Bias core (${BEFORE_CONFLICT})` });
    expect(copy?.remote).toBeUndefined();
    expect((await drafts.lastOpened())?.id).toBe(linkedId);
    expect(team.status().text).toBe('Saved to team · v2');
    expect(api.puts).toEqual([]);
  });

  it('offline: keeps the draft and its base version, says so, and sends the save when the server is back', async () => {
    vi.useFakeTimers();
    try {
      const n = api.seed('Bias core', CORE);
      await team.open(n.id);
      await typed(`${CORE}# offline edit\n`);
      api.online = false;
      expect(await team.push()).toEqual({ kind: 'offline' });
      expect(team.status().text).toBe('Saved in this browser; team server offline — will be saved when back online');
      expect((await backend.get(store.draftId()!))).toMatchObject({ text: `${CORE}# offline edit\n`, remote: { baseVersion: 1 } });
      api.online = true;
      await vi.advanceTimersByTimeAsync(RETRY_MS + 10);
      expect(api.puts).toEqual([{ id: n.id, source: `${CORE}# offline edit\n`, baseVersion: 1 }]);
      expect(team.status().text).toBe('Saved to team · v2');
    } finally {
      vi.useRealTimers();
    }
  });

  it('a viewer edits in this browser only: no save to the team', async () => {
    api.role = 'viewer';
    await TestBed.inject(Session).load(true);
    const n = api.seed('Bias core', CORE);
    await team.open(n.id);
    expect(team.canWrite()).toBe(false);
    expect(team.canCreate()).toBe(false);
    await typed(`${CORE}# my try\n`);
    expect(await team.push()).toEqual({ kind: 'read-only' });
    expect(api.puts).toEqual([]);
    expect(team.status().text).toBe('Team v1 · Read-only for your role; edits stay in this browser');
  });

  it('signed out: keeps the edits here and asks for a sign-in rather than blaming the role', async () => {
    const n = api.seed('Bias core', CORE);
    await team.open(n.id);
    api.signedIn = false;
    await TestBed.inject(Session).load(true);
    await typed(`${CORE}# after sign-out\n`);
    expect(team.status().text).toBe('Saved in this browser; sign in to save to the team');
    expect(await team.push()).toEqual({ kind: 'signed-out' });
    expect(api.puts).toEqual([]);
    expect((await backend.get(store.draftId()!))?.text).toBe(`${CORE}# after sign-out\n`);
  });

  it('links a draft to a netlist created from it', async () => {
    await typed(CORE);
    const created = await api.createNetlist('strainlab', { name: 'Bias core', source: CORE });
    await team.linkCreated(created, CORE);
    expect(store.remote()).toMatchObject({ netlistId: created.id, baseVersion: 1, savedText: CORE });
    expect((await backend.get(store.draftId()!))?.remote?.netlistId).toBe(created.id);
    expect(team.status().text).toBe('Saved to team · v1');
  });

  it('opens an old revision as an unlinked copy, the same copy the second time', async () => {
    const n = api.seed('Bias core', CORE);
    api.saveAs(n.id, `${CORE}# v2\n`);
    const out = await team.open(n.id, 1);
    expect(out.message).toBe('Revision 1 of “Bias core”, opened as a copy in this browser; the team netlist is unchanged.');
    expect(store.remote()).toBeUndefined();
    expect(store.title()).toBe('Bias core (revision 1)');
    expect(store.source()).toBe(CORE);
    const id = store.draftId();
    await team.open(n.id, 1);
    expect(store.draftId()).toBe(id);
    expect((await team.open(n.id, 7)).message).toBe('There is no revision 7 of that netlist.');
  });
});
