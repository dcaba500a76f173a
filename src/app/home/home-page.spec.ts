import { provideHttpClient } from '@angular/common/http';
import { provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { provideRouter } from '@angular/router';
import { EXAMPLES } from '../bench/examples';
import { Session } from '../core/session';
import { HomePage } from './home-page';

async function render(signedIn = false) {
  TestBed.configureTestingModule({ providers: [provideRouter([]), provideHttpClient(), provideHttpClientTesting()] });
  if (signedIn) {
    const session = TestBed.inject(Session);
    session.me.set({ user: { id: 'u', name: 'Ravi Lindqvist', email: 'ravi@strainlab.example' }, workspaces: [] });
    session.state.set('signed-in');
  }
  const fixture = TestBed.createComponent(HomePage);
  await fixture.whenStable();
  return fixture.nativeElement as HTMLElement;
}

describe('HomePage', () => {
  it('says what the product is for in two sentences and shows the cautions', async () => {
    const el = await render();
    const lead = el.querySelector('.lead')!.textContent!.replace(/\s+/g, ' ').trim();
    expect(lead.split(/(?<=\.)\s/).length).toBe(2);
    expect(lead).toContain('CMRR');
    expect(el.querySelector('nw-cautions [role="note"]')!.textContent).toContain('sign-off simulation');
  });

  it('opens each Strainlab example in the bench with one link', async () => {
    const el = await render();
    const links = [...el.querySelectorAll<HTMLAnchorElement>('a.example')];
    expect(links.map((a) => a.getAttribute('href'))).toEqual(EXAMPLES.map((e) => `/bench?example=${e.id}`));
    expect(links[0].textContent).toContain(EXAMPLES[0].label);
    expect(links[0].textContent).toContain(EXAMPLES[0].blurb);
  });

  it('offers the way on to the bench and the reference, and the team netlists when signed in', async () => {
    const out = await render();
    const hrefs = (el: HTMLElement) => [...el.querySelectorAll('.actions a')].map((a) => [a.textContent!.trim(), a.getAttribute('href')]);
    expect(hrefs(out)).toEqual([['Continue to the bench', '/bench'], ['Language reference', '/reference']]);
    TestBed.resetTestingModule();
    const signedIn = await render(true);
    expect(hrefs(signedIn)).toContainEqual(['Team netlists', '/netlists']);
  });
});
