import { absoluteTime, formatSize, nwlFileName, relativeTime, restorableDaysLeft, restorableText } from './format';

const NOW = Date.parse('2026-03-12T12:00:00Z');
const ago = (ms: number) => new Date(NOW - ms).toISOString();
const MIN = 60_000;
const DAY = 24 * 60 * MIN;

describe('relativeTime', () => {
  it('says how long ago in minutes, hours and days', () => {
    expect(relativeTime(ago(10_000), NOW)).toBe('just now');
    expect(relativeTime(ago(3 * MIN), NOW)).toBe('3 min ago');
    expect(relativeTime(ago(5 * 60 * MIN), NOW)).toBe('5 h ago');
    expect(relativeTime(ago(DAY), NOW)).toBe('yesterday');
    expect(relativeTime(ago(4 * DAY), NOW)).toBe('4 days ago');
  });

  it('writes a date once it is more than two weeks back, with the year only when it differs', () => {
    expect(relativeTime('2026-02-01T12:00:00Z', NOW)).toBe('1 Feb');
    expect(relativeTime('2025-11-20T12:00:00Z', NOW)).toBe('20 Nov 2025');
  });

  it('speaks of the future for expiries', () => {
    expect(relativeTime(ago(-20 * MIN), NOW)).toBe('in 20 min');
    expect(relativeTime(ago(-DAY), NOW)).toBe('tomorrow');
    expect(relativeTime(ago(-6 * DAY), NOW)).toBe('in 6 days');
  });

  it('gives nothing for a time it cannot read', () => {
    expect(relativeTime('not a time', NOW)).toBe('');
    expect(absoluteTime('not a time')).toBe('');
  });
});

describe('formatSize', () => {
  it('uses B below a kilobyte, one decimal below 10 kB, whole kB above', () => {
    expect(formatSize(0)).toBe('0 B');
    expect(formatSize(999)).toBe('999 B');
    expect(formatSize(4210)).toBe('4.2 kB');
    expect(formatSize(38_400)).toBe('38 kB');
    expect(formatSize(256_000)).toBe('256 kB');
    expect(formatSize(1_100_000)).toBe('1.1 MB');
  });
});

describe('restorableDaysLeft', () => {
  it('counts whole days left of the 30', () => {
    expect(restorableDaysLeft(ago(MIN), NOW)).toBe(29);
    expect(restorableDaysLeft(ago(10 * DAY + MIN), NOW)).toBe(19);
    expect(restorableDaysLeft(ago(29 * DAY + 60 * MIN), NOW)).toBe(0);
    expect(restorableDaysLeft(ago(31 * DAY), NOW)).toBe(0);
  });

  it('phrases the last days plainly', () => {
    expect(restorableText(ago(28 * DAY + MIN), NOW)).toBe('1 day left to restore');
    expect(restorableText(ago(29 * DAY + MIN), NOW)).toBe('Last day to restore');
    expect(restorableText(ago(MIN), NOW)).toBe('29 days left to restore');
  });
});

describe('nwlFileName', () => {
  it('keeps the name readable and safe for any file system', () => {
    expect(nwlFileName('Mirror-loaded pair v3')).toBe('Mirror-loaded pair v3.nwl');
    expect(nwlFileName('tail: 2 mA / 10 V?')).toBe('tail 2 mA 10 V.nwl');
    expect(nwlFileName('pair.nwl')).toBe('pair.nwl');
    expect(nwlFileName('***')).toBe('netlist.nwl');
  });
});
