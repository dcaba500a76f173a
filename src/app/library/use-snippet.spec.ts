import { blockName, instanceLine, useLine, useSnippet } from './use-snippet';

describe('use snippet', () => {
  const pins = [{ name: 'in', doc: 'reference in' }, { name: 'out', doc: null }, { name: 'rail', doc: 'emitters' }];

  it('pins the version and names every pin in order', () => {
    expect(useLine('mirrors/wilson_npn', 3)).toBe('use mirrors/wilson_npn@3');
    expect(instanceLine('mirrors/wilson_npn', pins)).toBe('x1: wilson_npn(in=…, out=…, rail=…)');
    expect(useSnippet('mirrors/wilson_npn', 3, pins)).toBe('use mirrors/wilson_npn@3\nx1: wilson_npn(in=…, out=…, rail=…)\n');
  });

  it('lists params with their defaults in a trailing comment', () => {
    const params = [{ name: 'ratio', doc: 'area ratio', default: '1' }, { name: 're', doc: null, default: null }];
    expect(instanceLine('mirrors/simple_npn', pins, params)).toBe('x1: simple_npn(in=…, out=…, rail=…)  # params: ratio=1 re');
  });

  it('takes the block name from the last part of the path', () => {
    expect(blockName('shifters/emitter_follower_npn')).toBe('emitter_follower_npn');
    expect(instanceLine('a/b', [])).toBe('x1: b()');
  });
});
