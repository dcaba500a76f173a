import { solveNetlist } from '../../../solver';
import { blockDocCheck, blockTemplate, checkBlockPath, parseTags } from './block-path';

describe('block path', () => {
  it('accepts category/name in lower case, digits and _', () => {
    expect(checkBlockPath(' mirrors/wilson_npn ')).toEqual({ path: 'mirrors/wilson_npn' });
    expect(checkBlockPath('a1/b_2')).toEqual({ path: 'a1/b_2' });
  });

  it('says what is wrong with a path the server would refuse', () => {
    const problem = (raw: string) => ('problem' in checkBlockPath(raw) ? (checkBlockPath(raw) as { problem: string }).problem : '');
    expect(problem('')).toContain('Give the block a path');
    expect(problem('wilson')).toContain('two parts');
    expect(problem('a/b/c')).toContain('two parts');
    expect(problem('Mirrors/wilson')).toContain('category must start with a lower-case letter');
    expect(problem('mirrors/wilson-npn')).toContain('“-” is not allowed');
    expect(problem('mirrors/2nd')).toContain('name must start with a lower-case letter');
    expect(problem(`${'c'.repeat(41)}/x`)).toContain('at most 40');
    expect(problem(`c/${'n'.repeat(61)}`)).toContain('at most 60');
  });

  it('reads tags, dropping blanks and repeats, and refuses overlong ones', () => {
    expect(parseTags(' npn, mirror ,,npn ')).toEqual({ tags: ['npn', 'mirror'] });
    expect(parseTags('')).toEqual({ tags: [] });
    expect('problem' in parseTags('x'.repeat(41))).toBe(true);
    expect('problem' in parseTags(Array.from({ length: 21 }, (_, i) => `t${i}`).join(','))).toBe(true);
  });

  it('starts a proposal from a documented block whose fixture solves and passes its check', () => {
    const text = blockTemplate('passives/my_res');
    const doc = blockDocCheck(text, 'my_res');
    expect(doc).toMatchObject({ defined: true, title: 'One line saying what the block is', problems: [] });
    const result = solveNetlist(text);
    expect(result.errors).toEqual([]);
    expect(result.checks.map((c) => c.pass)).toEqual([true]);
  });

  it('says when the source does not define the block the path names', () => {
    const doc = blockDocCheck(blockTemplate('passives/my_res'), 'other');
    expect(doc).toEqual({ defined: false, problem: 'The source must define `block other(…)`, the last part of the path; it defines my_res.' });
  });
});
