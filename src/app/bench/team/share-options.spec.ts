import { expiresText, expiryOf, openedText, parseEmails } from './share-options';

describe('share options', () => {
  // 12 March 2026, 15:30 in the test's own time zone.
  const now = new Date(2026, 2, 12, 15, 30);

  describe('expiryOf', () => {
    it('never expires unless asked', () => {
      expect(expiryOf('never', '', now)).toEqual({});
    });
    it('counts whole days from now', () => {
      expect(expiryOf('1d', '', now).expiresAt).toBe(new Date(now.getTime() + 86_400_000).toISOString());
      expect(expiryOf('7d', '', now).expiresAt).toBe(new Date(now.getTime() + 7 * 86_400_000).toISOString());
      expect(expiryOf('30d', '', now).expiresAt).toBe(new Date(now.getTime() + 30 * 86_400_000).toISOString());
    });
    it('takes a date as the end of that day, local time', () => {
      expect(expiryOf('date', '2026-03-20', now).expiresAt).toBe(new Date(2026, 2, 20, 23, 59, 59, 999).toISOString());
      expect(expiryOf('date', '2026-03-12', now).expiresAt).toBe(new Date(2026, 2, 12, 23, 59, 59, 999).toISOString());
    });
    it('refuses a missing, impossible or past date', () => {
      expect(expiryOf('date', '', now).error).toMatch(/Choose the day/);
      expect(expiryOf('date', '2026-02-30', now).error).toMatch(/not a calendar date/);
      expect(expiryOf('date', '2026-03-11', now).error).toMatch(/has passed/);
    });
  });

  it('splits typed addresses, once each, and sets aside what is not an address', () => {
    expect(parseEmails('mei@example.com, ada@example.org;  Mei@Example.com\nnot-an-address <bo@lab.io>')).toEqual({
      valid: ['mei@example.com', 'ada@example.org', 'bo@lab.io'],
      invalid: ['not-an-address'],
    });
    expect(parseEmails('  ')).toEqual({ valid: [], invalid: [] });
    expect(parseEmails('a@b').invalid).toEqual(['a@b']);
  });

  it('says how often a link was opened', () => {
    const t = Date.parse('2026-03-12T10:00:00Z');
    expect(openedText({ openCount: 0, lastOpenedAt: null }, t)).toBe('not opened yet');
    expect(openedText({ openCount: 1, lastOpenedAt: '2026-03-12T09:58:00Z' }, t)).toBe('opened once, 2 min ago');
    expect(openedText({ openCount: 3, lastOpenedAt: '2026-03-12T09:55:00Z' }, t)).toBe('opened 3 times, last 5 min ago');
  });

  it('says when a link stops working', () => {
    const t = Date.parse('2026-03-12T10:00:00Z');
    expect(expiresText({ expiresAt: null, state: 'active', revokedAt: null }, t)).toBe('never expires');
    expect(expiresText({ expiresAt: '2026-03-20T10:00:00Z', state: 'active', revokedAt: null }, t)).toMatch(/^expires /);
    expect(expiresText({ expiresAt: '2026-03-01T10:00:00Z', state: 'expired', revokedAt: null }, t)).toMatch(/^expired /);
    expect(expiresText({ expiresAt: null, state: 'revoked', revokedAt: '2026-03-02T10:00:00Z' }, t)).toMatch(/^revoked /);
  });
});
