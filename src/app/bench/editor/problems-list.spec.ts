import { TestBed } from '@angular/core/testing';
import { solveNetlist } from '../../../../solver';
import { ProblemsList } from './problems-list';

const TEXT = 'r1: res(a, gnd) 1k\nv1: vsrc(a, gnd) 1\nanalyze noise\nr2: res(a, gnd) 2meg\n';

async function render(text: string) {
  const r = solveNetlist(text);
  const fixture = TestBed.createComponent(ProblemsList);
  fixture.componentRef.setInput('diagnostics', [...r.errors, ...r.warnings].sort((a, b) => a.line - b.line));
  fixture.componentRef.setInput('text', text);
  const chosen: number[] = [];
  fixture.componentInstance.selected.subscribe((d) => chosen.push(d.line));
  await fixture.whenStable();
  return { el: fixture.nativeElement as HTMLElement, chosen };
}

describe('ProblemsList', () => {
  it('links each problem to its syntax in the reference, in a new tab', async () => {
    const { el } = await render(TEXT);
    const links = [...el.querySelectorAll<HTMLAnchorElement>('a.syntax')];
    expect(links.map((a) => a.getAttribute('href'))).toEqual(['/reference#analyze-noise', '/reference#lines-names-numbers']);
    expect(links[0].target).toBe('_blank');
    expect(links[0].textContent!.replace(/\s+/g, ' ').trim()).toBe('Syntax of analyze noise (opens in a new tab)');
  });

  it('names each problem by what it shows and goes to its line when chosen', async () => {
    const { el, chosen } = await render(TEXT);
    const [first] = [...el.querySelectorAll<HTMLButtonElement>('button.item')];
    expect(first.hasAttribute('aria-label')).toBe(false);
    expect(first.textContent!.replace(/\s+/g, ' ')).toContain('Error line 3 Expected `out`');
    first.click();
    expect(chosen).toEqual([3]);
    expect(el.querySelector('.head')!.textContent).toContain('2 errors, 0 warnings');
  });
});

describe('ProblemsList with an earlier text', () => {
  it('shows no green "No problems" for the diagnostics of an earlier text', async () => {
    const fixture = TestBed.createComponent(ProblemsList);
    fixture.componentRef.setInput('diagnostics', []);
    fixture.componentRef.setInput('stale', true);
    await fixture.whenStable();
    const el = fixture.nativeElement as HTMLElement;
    expect(el.querySelector('.ok')).toBeNull();
    expect(el.querySelector('.head')!.textContent).toContain('No problems in an earlier version of the text');
    fixture.componentRef.setInput('stale', false);
    await fixture.whenStable();
    expect(el.querySelector('.ok')!.textContent).toContain('No problems');
  });
});
