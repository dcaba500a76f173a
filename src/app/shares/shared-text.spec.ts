import { sharedMeta, shareProblem } from './shared-text';

describe('shared view wording', () => {
  it('says in a sentence why a link shows nothing', () => {
    expect(shareProblem('share_expired', 404)).toBe('This link has expired.');
    expect(shareProblem('share_revoked', 404)).toBe('This link was revoked by its author.');
    expect(shareProblem('share_not_found', 404)).toBe('There is no shared netlist at this address.');
    expect(shareProblem('offline', 0)).toMatch(/server cannot be reached/);
    expect(shareProblem('database_unavailable', 503)).toMatch(/server cannot be reached/);
  });

  it('describes the shared version, its author and its expiry', () => {
    const base = {
      version: 3,
      workspace: { name: 'Strainlab' },
      sharedBy: { name: 'Mei Tanaka' },
      sharedAt: '2026-03-12T10:00:00Z',
      author: { name: 'Mei Tanaka' },
      revisionCreatedAt: '2026-03-12T09:00:00Z',
    };
    const meta = sharedMeta({ ...base, expiresAt: null });
    expect(meta).toMatch(/^v3 · from Strainlab · shared by Mei Tanaka on .+ · does not expire$/);
    expect(sharedMeta({ ...base, expiresAt: '2026-03-19T10:00:00Z' })).toMatch(/ · expires .*2026/);
    expect(sharedMeta({ ...base, expiresAt: null, author: { name: 'Ada Quill' } })).toMatch(/this version saved by Ada Quill on /);
  });
});
