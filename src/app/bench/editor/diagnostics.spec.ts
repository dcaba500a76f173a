import { Text } from '@codemirror/state';
import { solveNetlist } from '../../../../solver';
import { toLintDiagnostics } from './diagnostics';

describe('lint diagnostics', () => {
  it('shows the message, the hint and a link to the syntax of the statement on the line', () => {
    const text = 'v1: vsrc(a, gnd) 1\nr1: res(a, gnd) 1k\nanalyze noise\n';
    const r = solveNetlist(text);
    const [lint] = toLintDiagnostics(Text.of(text.split('\n')), r.errors);
    const box = lint.renderMessage!({} as never) as HTMLElement;
    expect(box.querySelector('.nw-lint-text')!.textContent).toBe(r.errors[0].message);
    expect(box.querySelector('.nw-lint-hint')!.textContent).toContain('analyze noise out');
    const link = box.querySelector('a.nw-lint-syntax') as HTMLAnchorElement;
    expect(link.getAttribute('href')).toBe('/reference#analyze-noise');
    expect(link.target).toBe('_blank');
    expect(link.rel).toBe('noopener');
    expect(link.textContent).toBe('Syntax of analyze noise (opens in a new tab)');
  });
});
