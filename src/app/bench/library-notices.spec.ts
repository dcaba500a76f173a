import { libraryNotices, pinDigits } from './library-notices';
import type { UsedBlock } from './solver-protocol';

const TEXT = 'title t\nuse mirrors/wilson_npn@2\n  use pairs/p@1   # pinned\nuse tails/t@4\nuse x/y@1\n';
const use = (line: number, path: string, version: number, extra: Partial<UsedBlock>): UsedBlock => ({ line, path, version, docs: [], ...extra });

describe('library notices', () => {
  it('warns of a retired pin and offers the vetted version, placed on the version digits', () => {
    const [n] = libraryNotices([use(2, 'mirrors/wilson_npn', 2, { state: 'retired', newestVetted: 3, origin: 'workspace' })], TEXT);
    expect(n).toMatchObject({ severity: 'warning', code: 'library-retired', line: 2, col: 23, endCol: 25, change: { line: 2, path: 'mirrors/wilson_npn', from: 2, to: 3 } });
    expect(n.message).toContain('`mirrors/wilson_npn@2` is retired');
    expect(TEXT.split('\n')[1].slice(n.col - 1, n.endCol! - 1)).toBe('@2');
  });

  it('warns of a newer vetted version, and says nothing of the newest', () => {
    const notices = libraryNotices([
      use(3, 'pairs/p', 1, { state: 'vetted', newestVetted: 2 }),
      use(4, 'tails/t', 4, { state: 'vetted', newestVetted: 4 }),
    ], TEXT);
    expect(notices).toHaveLength(1);
    expect(notices[0]).toMatchObject({ code: 'library-newer', line: 3, change: { from: 1, to: 2 } });
  });

  it('says a draft is not vetted, with no change when nothing is vetted, and nothing for what did not resolve', () => {
    const notices = libraryNotices([use(5, 'x/y', 1, { state: 'draft', newestVetted: null }), use(4, 'tails/t', 4, {})], TEXT);
    expect(notices).toHaveLength(1);
    expect(notices[0]).toMatchObject({ code: 'library-unvetted', change: undefined });
    expect(notices[0].message).toContain('a draft');
  });

  it('finds the digits of a pin only while the line still pins that version', () => {
    const change = { line: 3, path: 'pairs/p', from: 1, to: 2 };
    expect(pinDigits('  use pairs/p@1   # pinned', change)).toEqual({ from: 14, to: 15 });
    expect(pinDigits('  use pairs/p@12', change)).toBeUndefined();
    expect(pinDigits('use pairs/px@1', change)).toBeUndefined();
  });
});
