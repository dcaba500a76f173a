import { solveNetlist } from '../../../solver';
import { resolveAnchor, statementOf, SYNTAX_SECTIONS, syntaxHref, syntaxSection } from './syntax-anchors';

/** The solver's diagnostics for a netlist, each with the text of its line. */
function problems(text: string) {
  const lines = text.split('\n');
  const r = solveNetlist(text);
  return [...r.errors, ...r.warnings].map((d) => ({ d, line: lines[d.line - 1] }));
}

describe('statementOf', () => {
  it('reads the statement a line starts', () => {
    expect(statementOf('  q1: npn(c=out, b=in, e=gnd) qn   # a part')).toBe('part');
    expect(statementOf('analyze noise')).toBe('analyze noise');
    expect(statementOf('analyze   ac from 10 Hz')).toBe('analyze ac');
    expect(statementOf('analyze')).toBe('analyze');
    expect(statementOf('measure a0 = db(adm)')).toBe('measure');
    expect(statementOf('# only a comment')).toBe('');
  });
});

describe('syntaxSection', () => {
  it('leads `analyze noise` with no arguments to the noise section', () => {
    const [p] = problems('r1: res(a, gnd) 1k\nv1: vsrc(a, gnd) 1\nanalyze noise\n');
    expect(p.d.line).toBe(3);
    expect(syntaxSection(p.d, p.line).anchor).toBe('analyze-noise');
    expect(syntaxHref(p.d, p.line)).toBe('/reference#analyze-noise');
  });

  it('leads each statement to its own section, and a mistake in a value to the numbers', () => {
    const text = [
      'v1: vsrc(a, gnd) 1',
      'r1: res(a, gnd) 1meg',
      'r2: res(a, gnd) 1k',
      'analyze ac from 10 Hz',
      'ports in=(v1)',
      'measure x = foo(1)',
      'check x >',
      'parm y = 2',
    ].join('\n');
    const anchors = problems(text).map(({ d, line }) => [d.line, syntaxSection(d, line).anchor]);
    expect(anchors).toEqual(expect.arrayContaining([
      [2, 'lines-names-numbers'],
      [4, 'analyze-ac'],
      [5, 'the-differential-ports'],
      [6, 'measures'],
      [7, 'checks'],
      [8, 'statements'],
    ]));
  });

  it('falls back to the list of diagnostics for a code and a line it does not know', () => {
    expect(syntaxSection({ code: 'something-new' }, 'whatever x y').anchor).toBe('diagnostics');
    expect(syntaxSection({ code: 'unknown-kind' }, undefined).anchor).toBe('parts');
  });

  it('names every code and keyword once', () => {
    const codes = SYNTAX_SECTIONS.flatMap((e) => e.codes ?? []);
    const keywords = SYNTAX_SECTIONS.flatMap((e) => e.keywords ?? []);
    expect(new Set(codes).size).toBe(codes.length);
    expect(new Set(keywords).size).toBe(keywords.length);
  });
});

describe('resolveAnchor', () => {
  const anchors = new Set(['analyses', 'analyze-ac', 'later-analyses', 'measures']);
  it('keeps an anchor the reference has, else takes its first fallback it has', () => {
    expect(resolveAnchor('analyze-ac', anchors)).toBe('analyze-ac');
    expect(resolveAnchor('analyze-noise', anchors)).toBe('later-analyses');
    expect(resolveAnchor('analyze-noise', new Set(['analyses']))).toBe('analyses');
    expect(resolveAnchor('no-such-place', anchors)).toBeUndefined();
    expect(resolveAnchor(null, anchors)).toBeUndefined();
  });
});
