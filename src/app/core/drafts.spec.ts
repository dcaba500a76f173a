import { TestBed } from '@angular/core/testing';
import { DRAFT_BACKEND, DRAFT_CLOCK, DRAFT_STASH, Drafts, MAX_DRAFTS, MemoryDraftBackend, MemoryStash, STASH_KEY, titleOf, UNTITLED, type DraftBackend, type DraftRemote } from './drafts';

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
  let stash: MemoryStash;
  let now = 1_000;

  beforeEach(() => {
    backend = new MemoryDraftBackend();
    stash = new MemoryStash();
    now = 1_000;
    TestBed.configureTestingModule({ providers: [{ provide: DRAFT_BACKEND, useValue: backend }, { provide: DRAFT_CLOCK, useValue: () => now }, { provide: DRAFT_STASH, useValue: stash }] });
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

  describe('the link to a team netlist', () => {
    const remote: DraftRemote = { netlistId: 'n1', workspace: 'strainlab', name: 'Bias core', baseVersion: 3, savedText: 'title Core\n' };

    it('is stored with the draft and kept across saves of new text', async () => {
      const d = await drafts.create('title Core\n', undefined, { remote });
      expect(d.remote).toEqual(remote);
      now += 10;
      await drafts.save(d.id, 'title Core, edited\n');
      const back = await backend.get(d.id);
      expect(back?.text).toBe('title Core, edited\n');
      expect(back?.remote).toEqual(remote);
    });

    it('moves to a new base version without new text, and can be removed', async () => {
      const d = await drafts.create('title Core\n', undefined, { remote });
      now += 10;
      const moved = await drafts.save(d.id, 'title Core\n', { remote: { ...remote, baseVersion: 4 } });
      expect(moved.updatedAt).toBe(now);
      expect((await backend.get(d.id))?.remote?.baseVersion).toBe(4);
      await drafts.save(d.id, 'title Core\n', { remote: null });
      expect((await backend.get(d.id))?.remote).toBeUndefined();
    });

    it('is written again with the text when the draft was deleted meanwhile', async () => {
      const d = await drafts.create('title Core\n', undefined, { remote });
      await drafts.remove(d.id);
      await drafts.save(d.id, 'title Core, kept\n', { remote });
      expect((await backend.get(d.id))?.remote).toEqual(remote);
    });

    it('finds the draft linked to a netlist, the most recently changed first', async () => {
      await drafts.create('title Other\n');
      const old = await drafts.create('title Core\n', undefined, { remote });
      now += 10;
      const newer = await drafts.create('title Core 2\n', undefined, { remote: { ...remote, baseVersion: 4 } });
      expect((await drafts.linkedTo('n1'))?.id).toBe(newer.id);
      expect(old.id).not.toBe(newer.id);
      expect(await drafts.linkedTo('n2')).toBeUndefined();
    });

    it('labels a copy after its title and finds it again by text and label', async () => {
      const copy = await drafts.create('title Core\n', undefined, { label: 'revision 2' });
      expect(copy.title).toBe('Core (revision 2)');
      now += 10;
      await drafts.save(copy.id, 'title Core tuned\n');
      expect(drafts.list()[0].title).toBe('Core tuned (revision 2)');
      expect(await drafts.findCopy('title Core tuned\n', 'revision 2')).toMatchObject({ id: copy.id });
      expect(await drafts.findCopy('title Core tuned\n', 'revision 3')).toBeUndefined();
    });

    it('survives a round trip through storage as plain data (structured clone)', async () => {
      const d = await drafts.create('title Core\n', undefined, { remote });
      const stored = await backend.get(d.id);
      expect(structuredClone(stored)).toEqual(stored);
    });
  });

  describe('the stash of text not yet written', () => {
    it('moves a stash of a netlist never saved into a new draft, opened next, and empties the stash', async () => {
      drafts.stash({ text: 'title Typed, then reloaded\n', fileName: 'pair.nwl' });
      const draft = await drafts.recoverStash();
      expect(draft).toMatchObject({ title: 'Typed, then reloaded', text: 'title Typed, then reloaded\n', fileName: 'pair.nwl' });
      expect((await drafts.lastOpened())?.id).toBe(draft!.id);
      expect(stash.items.has(STASH_KEY)).toBe(false);
      expect(await drafts.recoverStash()).toBeUndefined();
    });

    it('writes a stash into its own draft, link and label kept, and reuses a draft that already holds the text', async () => {
      const remote: DraftRemote = { netlistId: 'n1', workspace: 'strainlab', name: 'Core', baseVersion: 2, savedText: 'title Core\n' };
      const d = await drafts.create('title Core\n', undefined, { remote });
      await drafts.create('title Other\n');
      drafts.stash({ draftId: d.id, text: 'title Core, edited\n', remote });
      expect((await drafts.recoverStash())?.id).toBe(d.id);
      expect(await backend.get(d.id)).toMatchObject({ text: 'title Core, edited\n', remote });
      expect((await drafts.lastOpened())?.id).toBe(d.id);

      // The page wrote its draft but unloaded before removing the stash: no second draft.
      drafts.stash({ text: 'title Other\n' });
      await drafts.recoverStash();
      expect((await backend.all()).filter((x) => x.text === 'title Other\n')).toHaveLength(1);
    });

    it('keeps a newer stash when clearing an older text, and ignores what is not a stash', async () => {
      drafts.stash({ text: 'title Newer\n' });
      drafts.clearStash('title Older\n');
      expect(stash.items.has(STASH_KEY)).toBe(true);
      drafts.clearStash('title Newer\n');
      expect(stash.items.has(STASH_KEY)).toBe(false);
      stash.setItem(STASH_KEY, '{not json');
      expect(await drafts.recoverStash()).toBeUndefined();
      stash.setItem(STASH_KEY, JSON.stringify({ draftId: 7, text: 'x' }));
      expect(await drafts.recoverStash()).toBeUndefined();
      expect(await backend.all()).toEqual([]);
    });

    it('keeps the stash for the next visit when the draft cannot be written', async () => {
      const failing = new MemoryDraftBackend();
      failing.put = () => Promise.reject(new Error('QuotaExceededError'));
      TestBed.resetTestingModule();
      TestBed.configureTestingModule({ providers: [{ provide: DRAFT_BACKEND, useValue: failing }, { provide: DRAFT_STASH, useValue: stash }] });
      const d = TestBed.inject(Drafts);
      d.stash({ text: 'title Not lost\n' });
      expect(await d.recoverStash()).toBeUndefined();
      expect(JSON.parse(stash.getItem(STASH_KEY)!).text).toBe('title Not lost\n');
    });
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
