import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting, type TestRequest } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { Session } from '../core/session';
import type { Me } from '../core/team-api';
import type { BlockSummary } from '../library/library-api';
import { LibraryIndex, SEED_MANIFEST_URL, seedEntries } from './library-index';

const ME: Me = {
  user: { id: 'u1', name: 'Ravi' } as Me['user'],
  workspaces: [{ slug: 'strainlab', name: 'Strainlab', role: 'designer' }, { slug: 'other', name: 'Other lab', role: 'viewer' }],
};

const MANIFEST = {
  blocks: [
    { path: 'mirrors/simple_npn', version: 1, file: 'mirrors/simple_npn@1.nwl', title: 'Simple npn current mirror', summary: 'Two transistors.' },
    { path: 'mirrors/wilson_npn', version: 3, file: 'mirrors/wilson_npn@3.nwl', title: 'Wilson npn current mirror', summary: 'Three transistors.' },
  ],
};

function row(path: string, latest: BlockSummary['latest'], vetted: number | null, versions: number): BlockSummary {
  return { id: path, path, category: path.split('/')[0], title: `${path} title`, summary: `${path} summary`, tags: [], latest, vetted, versions, updatedAt: '2026-12-01T00:00:00.000Z' };
}

/** Lets the answers' promise chains run (firstValueFrom → async loaders → signals). */
async function settle(): Promise<void> {
  for (let i = 0; i < 5; i++) await Promise.resolve();
  TestBed.tick();
}

describe('LibraryIndex', () => {
  let http: HttpTestingController;
  let session: Session;

  beforeEach(() => {
    TestBed.configureTestingModule({ providers: [provideHttpClient(), provideHttpClientTesting()] });
    http = TestBed.inject(HttpTestingController);
    session = TestBed.inject(Session);
  });
  afterEach(() => {
    localStorage.removeItem('nodewright.workspace'); // chooseWorkspace remembers the choice
    http.verify();
  });

  function start(signedIn: boolean): LibraryIndex {
    session.me.set(signedIn ? ME : null);
    session.state.set(signedIn ? 'signed-in' : 'signed-out');
    const index = TestBed.inject(LibraryIndex);
    TestBed.tick();
    return index;
  }

  const catalogue = (slug: string): TestRequest => http.expectOne((r) => r.method === 'GET' && r.url === `/api/workspaces/${slug}/blocks`);

  it('offers the seed library alone when signed out, every seed version vetted', async () => {
    const index = start(false);
    http.expectOne(SEED_MANIFEST_URL).flush(MANIFEST);
    await settle();
    expect(index.entries().map((e) => [e.path, e.origin, e.versions])).toEqual([
      ['mirrors/simple_npn', 'seed', [{ version: 1, state: 'vetted' }]],
      ['mirrors/wilson_npn', 'seed', [{ version: 3, state: 'vetted' }]],
    ]);
    expect(index.entries()[1].title).toBe('Wilson npn current mirror');
  });

  it('merges the workspace catalogue with the seed blocks it lacks', async () => {
    const index = start(true);
    http.expectOne(SEED_MANIFEST_URL).flush(MANIFEST);
    catalogue('strainlab').flush({
      items: [
        row('mirrors/wilson_npn', { version: 5, state: 'in_review' }, 4, 5),
        row('tails/local_tail', { version: 1, state: 'draft' }, null, 1),
      ],
      total: 2,
    });
    await settle();
    const entries = index.entries();
    expect(entries.map((e) => `${e.path} ${e.origin}`)).toEqual(['mirrors/wilson_npn workspace', 'tails/local_tail workspace', 'mirrors/simple_npn seed']);
    expect(entries[0].versions).toEqual([{ version: 5, state: 'in_review' }, { version: 4, state: 'vetted' }]);
    expect(entries[0].title).toBe('mirrors/wilson_npn title');
    expect(entries[1].versions).toEqual([{ version: 1, state: 'draft' }]);
  });

  it('fetches the full version list of a block once, and only when the catalogue row lacks some', async () => {
    const index = start(true);
    http.expectOne(SEED_MANIFEST_URL).flush(MANIFEST);
    catalogue('strainlab').flush({ items: [row('mirrors/wilson_npn', { version: 5, state: 'in_review' }, 4, 5), row('pairs/p', { version: 1, state: 'vetted' }, 1, 1)], total: 2 });
    await settle();

    index.loadVersions('pairs/p'); // the catalogue named its only version
    index.loadVersions('mirrors/simple_npn'); // a seed block
    http.expectNone(() => true);

    index.loadVersions('mirrors/wilson_npn');
    index.loadVersions('mirrors/wilson_npn');
    const detail = http.expectOne({ method: 'GET', url: '/api/workspaces/strainlab/blocks/mirrors/wilson_npn' });
    detail.flush({
      ...row('mirrors/wilson_npn', { version: 5, state: 'in_review' }, 4, 5),
      versionsList: [5, 4, 3, 2, 1].map((version) => ({ version, state: version === 5 ? 'in_review' : version === 4 || version === 2 ? 'vetted' : 'retired' })),
    });
    await settle();
    expect(index.entries()[0].versions).toEqual([
      { version: 5, state: 'in_review' }, { version: 4, state: 'vetted' }, { version: 3, state: 'retired' }, { version: 2, state: 'vetted' }, { version: 1, state: 'retired' },
    ]);
    index.loadVersions('mirrors/wilson_npn');
    http.expectNone(() => true);
  });

  it('asks for further pages only while the total says rows are missing', async () => {
    const index = start(true);
    http.expectOne(SEED_MANIFEST_URL).flush({ blocks: [] });
    catalogue('strainlab').flush({ items: [row('a/one', { version: 1, state: 'vetted' }, 1, 1)], total: 2 });
    await settle();
    const page = http.expectOne((r) => r.url === '/api/workspaces/strainlab/blocks' && r.params.get('page') === '1');
    page.flush({ items: [row('b/two', { version: 2, state: 'vetted' }, 2, 2)], total: 2 });
    await settle();
    expect(index.entries().map((e) => e.path)).toEqual(['a/one', 'b/two']);
  });

  it('keeps the seed list when the catalogue fails, and follows a change of workspace', async () => {
    const index = start(true);
    http.expectOne(SEED_MANIFEST_URL).flush(MANIFEST);
    catalogue('strainlab').flush({ error: { code: 'database_unavailable' } }, { status: 503, statusText: 'Service Unavailable' });
    await settle();
    expect(index.entries().map((e) => e.origin)).toEqual(['seed', 'seed']);

    session.chooseWorkspace('other');
    TestBed.tick();
    catalogue('other').flush({ items: [row('mirrors/simple_npn', { version: 2, state: 'vetted' }, 2, 2)], total: 1 });
    await settle();
    expect(index.entries().map((e) => `${e.path} ${e.origin}`)).toEqual(['mirrors/simple_npn workspace', 'mirrors/wilson_npn seed']);

    session.state.set('offline');
    TestBed.tick();
    await settle();
    expect(index.entries().map((e) => e.origin)).toEqual(['seed', 'seed']);
  });

  it('drops a late catalogue answer for a workspace no longer chosen', async () => {
    const index = start(true);
    http.expectOne(SEED_MANIFEST_URL).flush({ blocks: [] });
    const late = catalogue('strainlab');
    session.chooseWorkspace('other');
    TestBed.tick();
    catalogue('other').flush({ items: [row('x/other', { version: 1, state: 'vetted' }, 1, 1)], total: 1 });
    late.flush({ items: [row('x/strain', { version: 1, state: 'vetted' }, 1, 1)], total: 1 });
    await settle();
    expect(index.entries().map((e) => e.path)).toEqual(['x/other']);
  });

  it('offers nothing, and does not throw, when even the manifest cannot be read', async () => {
    const index = start(false);
    http.expectOne(SEED_MANIFEST_URL).error(new ProgressEvent('error'));
    await settle();
    expect(index.entries()).toEqual([]);
  });
});

describe('seedEntries', () => {
  it('groups versions of one path newest first and skips malformed rows', () => {
    const entries = seedEntries([
      { path: 'm/a', version: 1, title: 'old title' },
      { path: 'm/a', version: 2, title: 'new title', summary: 's' },
      { path: 42, version: 1 },
      { path: 'm/b' },
    ]);
    expect(entries).toEqual([{ path: 'm/a', title: 'new title', summary: 's', versions: [{ version: 2, state: 'vetted' }, { version: 1, state: 'vetted' }], origin: 'seed' }]);
    expect(seedEntries(undefined)).toEqual([]);
  });
});
