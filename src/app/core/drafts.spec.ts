import { TestBed } from '@angular/core/testing';
import { DRAFT_BACKEND, DRAFT_CLOCK, Drafts, MAX_DRAFTS, MemoryDraftBackend, titleOf, UNTITLED, type DraftBackend } from './drafts';

describe('titleOf', () => {
  it('takes the first title line, without its comment', () => {
    expect(titleOf('# a pair\ntitle  Strainlab step 1   # the baseline\nparam rc = 8k')).toBe('Strainlab step 1');
  });
  it('falls back when there is no title line or it is empty', () => {
    expect(titleOf('param rc = 8k')).toBe(UNTITLED);
    expect(titleOf('title   \n', 'pair.nwl')).toBe('pair.nwl');
  });
  it('does not take a part or param named like the keyword', () => {
    expect(titleOf('titles: res(a, b) 1k\nparam title_x = 1')).toBe(UNTITLED);
  });
});

describe('Drafts', () => {
  let drafts: Drafts;
  let backend: MemoryDraftBackend;
  let now = 1_000;

  beforeEach(() => {
    backend = new MemoryDraftBackend();
    now = 1_000;
    TestBed.configureTestingModule({ providers: [{ provide: DRAFT_BACKEND, useValue: backend }, { provide: DRAFT_CLOCK, useValue: () => now }] });
    drafts = TestBed.inject(Drafts);
  });

  it('creates a draft titled from its text and reopens it as the last one', async () => {
    const d = await drafts.create('title Mirrored tail\nq1: npn(c=a, b=b, e=c)');
    expect(d.title).toBe('Mirrored tail');
    expect((await drafts.lastOpened())?.id).toBe(d.id);
    expect(drafts.list().map((x) => x.id)).toEqual([d.id]);
  });

  it('saves new text into the same draft, retitles it, and lists the latest change first', async () => {
    const a = await drafts.create('title A');
    now += 10;
    const b = await drafts.create('title B');
    now += 10;
    await drafts.save(a.id, 'title A, second try');
    expect(drafts.list().map((d) => d.title)).toEqual(['A, second try', 'B']);
    expect(drafts.list()[0].id).toBe(a.id);
    expect(drafts.list()[0].createdAt).toBe(1_000);
    expect(b.id).not.toBe(a.id);
  });

  it('does not rewrite a draft whose text has not changed', async () => {
    const a = await drafts.create('title A');
    now += 500;
    const again = await drafts.save(a.id, 'title A');
    expect(again.updatedAt).toBe(a.updatedAt);
  });

  it('names a draft from a file after its title line, else after the file', async () => {
    expect((await drafts.create('param rc = 1k', 'bridge.nwl')).title).toBe('bridge.nwl');
    expect((await drafts.create('title Bridge amp\n', 'bridge.nwl')).title).toBe('Bridge amp');
  });

  it('opening remembers the draft; deleting removes it from the list and from last-opened', async () => {
    const a = await drafts.create('title A');
    const b = await drafts.create('title B');
    await drafts.open(a.id);
    expect((await drafts.lastOpened())?.id).toBe(a.id);
    await drafts.remove(a.id);
    expect(drafts.list().map((d) => d.id)).toEqual([b.id]);
    expect(await drafts.lastOpened()).toBeUndefined();
  });

  it('saving into a draft deleted meanwhile (another tab) creates it again rather than losing the text', async () => {
    const a = await drafts.create('title A');
    await drafts.remove(a.id);
    const back = await drafts.save(a.id, 'title A kept');
    expect(back.id).toBe(a.id);
    expect(drafts.list().map((d) => d.title)).toEqual(['A kept']);
  });

  it(`keeps at most ${MAX_DRAFTS}, dropping the least recently changed`, async () => {
    const first = await drafts.create('title first');
    for (let k = 0; k < MAX_DRAFTS; k++) {
      now += 1;
      await drafts.create(`title d${k}`);
    }
    expect(drafts.list()).toHaveLength(MAX_DRAFTS);
    expect(drafts.list().some((d) => d.id === first.id)).toBe(false);
  });

  it('says so when storage fails, instead of throwing into the bench', async () => {
    const broken: DraftBackend = {
      all: () => Promise.reject(new Error('QuotaExceededError')),
      get: () => Promise.reject(new Error('QuotaExceededError')),
      put: () => Promise.reject(new Error('QuotaExceededError')),
      delete: () => Promise.reject(new Error('QuotaExceededError')),
      getMeta: () => Promise.reject(new Error('QuotaExceededError')),
      setMeta: () => Promise.reject(new Error('QuotaExceededError')),
    };
    TestBed.resetTestingModule();
    TestBed.configureTestingModule({ providers: [{ provide: DRAFT_BACKEND, useValue: broken }] });
    const d = TestBed.inject(Drafts);
    await expect(d.create('title X')).resolves.toMatchObject({ title: 'X' });
    expect(d.problem()).toContain('QuotaExceededError');
  });
});
