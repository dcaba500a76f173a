import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting, type TestRequest } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { provideRouter } from '@angular/router';
import { App } from './app';
import { routes } from './app.routes';
import { requireSignIn } from './core/session';
import type { Me } from './core/team-api';

const ADA: Me = {
  user: { id: 'u-ada', name: 'Ada Okafor', email: 'ada@strainlab.example' },
  workspaces: [
    { slug: 'strainlab', name: 'Strainlab sensor front end', role: 'admin' },
    { slug: 'tidepool', name: 'Tidepool hydrophone preamp', role: 'viewer' },
  ],
};

describe('App shell', () => {
  let http: HttpTestingController;

  beforeEach(() => {
    localStorage.clear();
    TestBed.configureTestingModule({ imports: [App], providers: [provideRouter(routes), provideHttpClient(), provideHttpClientTesting()] });
    http = TestBed.inject(HttpTestingController);
  });

  afterEach(() => http.verify());

  /** Renders the shell and answers its one question to the server. */
  async function shellWhen(answer: (req: TestRequest) => void): Promise<HTMLElement> {
    const fixture = TestBed.createComponent(App);
    answer(http.expectOne('/api/me'));
    await new Promise((done) => setTimeout(done)); // the session's awaited answer lands
    await fixture.whenStable();
    return fixture.nativeElement as HTMLElement;
  }
  const places = (el: HTMLElement) => [...el.querySelectorAll('nav.places a')].map((a) => a.textContent?.trim());

  it('signed out: the product name, the bench and library, and a Sign in button', async () => {
    const el = await shellWhen((r) => r.flush({ error: { code: 'signed_out', message: 'Sign in first.' } }, { status: 401, statusText: 'Unauthorized' }));
    expect(el.querySelector('.top-bar .name')?.textContent).toBe('Nodewright');
    expect(places(el)).toEqual(['Bench', 'Library']);
    expect([...el.querySelectorAll('.top-bar button')].some((b) => b.textContent?.trim() === 'Sign in')).toBe(true);
    expect(el.querySelector('.offline')).toBeNull();
  });

  it('signed in as an admin of two workspaces: netlists and members places, the switcher and the account menu', async () => {
    const el = await shellWhen((r) => r.flush(ADA));
    expect(places(el)).toEqual(['Bench', 'Netlists', 'Library', 'Members']);
    expect(el.querySelector('nav.places a:last-child')?.getAttribute('href')).toBe('/w/strainlab/admin');
    expect(el.querySelector('.workspace')?.textContent).toContain('Strainlab sensor front end');
    expect(el.querySelector('.user')?.textContent).toContain('Ada Okafor');
    expect([...el.querySelectorAll('.top-bar button')].some((b) => b.textContent?.trim() === 'Sign in')).toBe(false);
  });

  it('hides Members in a workspace where the user is not an admin', async () => {
    localStorage.setItem('nodewright.workspace', 'tidepool');
    const el = await shellWhen((r) => r.flush(ADA));
    expect(places(el)).toEqual(['Bench', 'Netlists', 'Library']);
    expect(el.querySelector('.workspace')?.textContent).toContain('Tidepool hydrophone preamp');
  });

  it('shows a single workspace by name, without a switcher', async () => {
    const el = await shellWhen((r) => r.flush({ ...ADA, workspaces: [ADA.workspaces[1]] }));
    expect(el.querySelector('.workspace')).toBeNull();
    expect(el.querySelector('.workspace-one')?.textContent).toContain('Tidepool hydrophone preamp');
  });

  it('says quietly that the team server is offline, and offers no sign-in it cannot do', async () => {
    const el = await shellWhen((r) => r.error(new ProgressEvent('error'), { status: 0, statusText: '' }));
    expect(el.querySelector('.offline')?.textContent).toContain('Team server offline — the bench keeps working');
    expect(places(el)).toEqual(['Bench', 'Library']);
    expect(el.querySelector('.user')).toBeNull();
  });
});

describe('Routes', () => {
  it('routes the empty path to the front page, /reference to the language reference, and loads every page lazily', () => {
    expect(routes[0]).toMatchObject({ path: '', pathMatch: 'full' });
    expect(routes.some((r) => r.path === 'reference')).toBe(true);
    expect(routes.every((r) => (r.loadComponent || r.loadChildren) && !r.redirectTo)).toBe(true);
  });

  it('asks for sign-in on the team pages only: the bench, library, invitations, shares and sign-in stay open', () => {
    const guarded = routes.filter((r) => r.canActivate?.includes(requireSignIn)).map((r) => r.path);
    expect([...guarded].sort()).toEqual(['netlists', 'netlists/:id/revisions', 'w/:slug/admin', 'w/:slug/library', 'w/:slug/netlists']);
  });
});
