import { checksSummary, latestNote, reviewKindWords, stateLabel, STATE_CHIP, versionChip, vettedBadge } from './block-words';
import { BLOCK_STATES } from './library-api';

describe('block words', () => {
  it('has a chip with a word and a symbol for every state', () => {
    for (const s of BLOCK_STATES) {
      expect(STATE_CHIP[s].label).toMatch(/^[A-Z]/);
      expect(STATE_CHIP[s].symbol).not.toBe('');
    }
    expect(BLOCK_STATES.map(stateLabel)).toEqual(['Draft', 'In review', 'Vetted', 'Retired']);
    expect(versionChip(4, 'in_review')).toBe('v4 · In review');
  });

  it('badges the vetted version and notes a newer one in another state', () => {
    expect(vettedBadge({ vetted: 3 })).toBe('vetted v3');
    expect(vettedBadge({ vetted: null })).toBeUndefined();
    expect(latestNote({ vetted: 3, latest: { version: 4, state: 'in_review' } })).toBe('v4 in review');
    expect(latestNote({ vetted: 3, latest: { version: 3, state: 'vetted' } })).toBeUndefined();
    expect(latestNote({ vetted: null, latest: { version: 1, state: 'draft' } })).toBe('v1 draft');
    expect(latestNote({ vetted: 2, latest: { version: 5, state: 'retired' } })).toBe('v5 retired');
  });

  it('says how review entries and check counts read', () => {
    expect(reviewKindWords('send_back')).toBe('sent it back to draft');
    expect(reviewKindWords('approve')).toBe('approved it: vetted');
    expect(reviewKindWords('something_new')).toBe('something_new');
    expect(checksSummary(0, 0)).toBe('no checks');
    expect(checksSummary(1, 0)).toBe('1 check, all pass');
    expect(checksSummary(3, 1)).toBe('3 checks, 1 failing');
  });
});
