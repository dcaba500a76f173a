import { comparePair, previousVersion, toggleCompare } from './revision-choice';

describe('toggleCompare', () => {
  it('keeps at most two, dropping the one ticked first', () => {
    expect(toggleCompare([], 5)).toEqual([5]);
    expect(toggleCompare([5], 2)).toEqual([5, 2]);
    expect(toggleCompare([5, 2], 7)).toEqual([2, 7]);
  });

  it('unticks a version ticked already', () => {
    expect(toggleCompare([5, 2], 5)).toEqual([2]);
  });
});

describe('comparePair', () => {
  it('puts the older version on the left whatever the order of ticking', () => {
    expect(comparePair([7, 3])).toEqual({ older: 3, newer: 7 });
    expect(comparePair([3, 7])).toEqual({ older: 3, newer: 7 });
  });

  it('has no pair until two are ticked', () => {
    expect(comparePair([4])).toBeUndefined();
  });
});

describe('previousVersion', () => {
  it('finds the next older entry of a newest-first list, which may skip numbers', () => {
    expect(previousVersion([9, 8, 5, 1], 8)).toBe(5);
    expect(previousVersion([9, 8, 5, 1], 1)).toBeUndefined();
    expect(previousVersion([9, 8], 4)).toBeUndefined();
  });
});
