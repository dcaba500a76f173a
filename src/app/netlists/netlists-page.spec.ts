import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { provideRouter } from '@angular/router';
import { Session } from '../core/session';
import type { NetlistSummary, Role } from '../core/team-api';
import { NetlistsPage } from './netlists-page';

const RAVI = { id: 'u-ravi', name: 'Ravi Lindqvist', email: 'ravi@strainlab.example' };

function netlist(id: string, name: string): NetlistSummary {
  const t = new Date(Date.now() - 5 * 60_000).toISOString();
  return {
    id, name, workspace: 'strainlab', visibility: 'workspace', version: 3, size: 4210, owner: RAVI, updatedBy: RAVI,
    createdAt: t, updatedAt: t, deletedAt: null, canWrite: true, canDelete: true,
  };
}

describe('NetlistsPage', () => {
  let http: HttpTestingController;

  async function open(role: Role) {
    TestBed.configureTestingModule({ providers: [provideRouter([]), provideHttpClient(), provideHttpClientTesting()] });
    http = TestBed.inject(HttpTestingController);
    const session = TestBed.inject(Session);
    session.me.set({ user: RAVI, workspaces: [{ slug: 'strainlab', name: 'Strainlab sensor front end', role }] });
    session.state.set('signed-in');
    const fixture = TestBed.createComponent(NetlistsPage);
    await fixture.whenStable();
    return fixture;
  }

  /** Lets the page's awaited answers land, then waits for the rendering they cause. */
  async function settle(fixture: { whenStable(): Promise<unknown> }): Promise<void> {
    await new Promise((done) => setTimeout(done));
    await fixture.whenStable();
  }

  const listCall = () => http.expectOne((r) => r.url === '/api/workspaces/strainlab/netlists');

  afterEach(() => http.verify());

  it('asks the server for the first page, newest first, and shows its rows', async () => {
    const fixture = await open('designer');
    const req = listCall();
    expect(req.request.params.toString()).toBe('sort=updatedAt&order=desc&page=0&pageSize=25');
    req.flush({ items: [netlist('n1', 'Mirror-loaded pair'), netlist('n2', 'Cascoded follower')], total: 2 });
    await settle(fixture);
    const el = fixture.nativeElement as HTMLElement;
    expect([...el.querySelectorAll('td a.name')].map((a) => a.textContent?.trim())).toEqual(['Mirror-loaded pair', 'Cascoded follower']);
    expect(el.querySelector('td a.name')?.getAttribute('href')).toBe('/bench?netlist=n1');
    expect(el.textContent).toContain('5 min ago');
    expect(el.textContent).toContain('4.2 kB');
    expect(el.textContent).toContain('New netlist');
  });

  it('searches after a pause in typing and goes back to the first page', async () => {
    const fixture = await open('designer');
    listCall().flush({ items: [netlist('n1', 'Mirror-loaded pair')], total: 60 });
    await settle(fixture);
    const el = fixture.nativeElement as HTMLElement;
    (el.querySelector('button.mat-mdc-paginator-navigation-next') as HTMLButtonElement).click();
    await settle(fixture);
    expect(listCall().request.params.get('page')).toBe('1');

    const input = el.querySelector('input[type="search"]') as HTMLInputElement;
    for (const text of ['mi', 'mirr']) {
      input.value = text;
      input.dispatchEvent(new Event('input'));
    }
    http.expectNone((r) => r.url === '/api/workspaces/strainlab/netlists'); // not on every keystroke
    await new Promise((done) => setTimeout(done, 300));
    await settle(fixture);
    const req = listCall();
    expect(req.request.params.get('q')).toBe('mirr');
    expect(req.request.params.get('page')).toBe('0');
    req.flush({ items: [], total: 0 });
    await settle(fixture);
    expect(el.querySelector('.empty')?.textContent).toContain('No netlist name contains “mirr”');
  });

  it('offers no writing to a viewer', async () => {
    const fixture = await open('viewer');
    listCall().flush({ items: [], total: 0 });
    await settle(fixture);
    const el = fixture.nativeElement as HTMLElement;
    expect(el.textContent).not.toContain('New netlist');
    expect(el.textContent).not.toContain('Upload');
    expect(el.querySelector('.empty')?.textContent).toContain('once a designer saves one');
  });
});
