import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { provideRouter, withComponentInputBinding } from '@angular/router';
import { RouterTestingHarness } from '@angular/router/testing';
import { Session } from '../core/session';
import type { Role } from '../core/team-api';
import type { BlockSummary } from './library-api';
import { LIBRARY_ROUTES } from './library.routes';
import { SEARCH_PAUSE_MS } from './library-page';

const RAVI = { id: 'u-ravi', name: 'Ravi Lindqvist', email: 'ravi@strainlab.example' };

function block(path: string, vetted: number | null, latest: BlockSummary['latest'], tags: string[] = []): BlockSummary {
  return {
    id: path, path, category: path.split('/')[0], title: `Title of ${path}`, summary: `What ${path} does.`, tags, latest, vetted,
    versions: latest.version, updatedAt: new Date(Date.now() - 5 * 60_000).toISOString(),
  };
}

describe('LibraryPage (catalogue)', () => {
  let http: HttpTestingController;

  async function open(role: Role, url = '/library', state: 'signed-in' | 'offline' | 'signed-out' = 'signed-in') {
    TestBed.configureTestingModule({
      providers: [
        provideRouter([{ path: 'library', children: LIBRARY_ROUTES }, { path: 'w/:slug/library', children: LIBRARY_ROUTES }], withComponentInputBinding()),
        provideHttpClient(), provideHttpClientTesting(),
      ],
    });
    http = TestBed.inject(HttpTestingController);
    const session = TestBed.inject(Session);
    session.me.set(state === 'signed-in' ? { user: RAVI, workspaces: [{ slug: 'strainlab', name: 'Strainlab', role }, { slug: 'other', name: 'Other lab', role: 'viewer' }] } : null);
    session.state.set(state);
    const harness = await RouterTestingHarness.create();
    await harness.navigateByUrl(url);
    return { harness, el: harness.routeNativeElement as HTMLElement };
  }

  async function settle(harness: RouterTestingHarness): Promise<void> {
    await new Promise((done) => setTimeout(done));
    await harness.fixture.whenStable();
  }

  const listCall = (slug = 'strainlab') => http.expectOne((r) => r.url === `/api/workspaces/${slug}/blocks`);

  afterEach(() => http.verify());

  it('lists blocks with the vetted badge, a newer version’s state and the categories present', async () => {
    const { harness, el } = await open('designer');
    const req = listCall();
    expect(req.request.params.keys()).toEqual([]);
    req.flush({ items: [
      block('mirrors/wilson_npn', 3, { version: 4, state: 'in_review' }, ['npn', 'mirror']),
      block('pairs/resistor_tail_npn', 1, { version: 1, state: 'vetted' }, ['npn']),
      block('shifters/new_one', null, { version: 1, state: 'draft' }),
    ], total: 3 });
    await settle(harness);
    const rows = [...el.querySelectorAll('tr.mat-mdc-row')];
    expect(rows.map((r) => r.querySelector('a.path')?.textContent?.trim())).toEqual(['mirrors/wilson_npn', 'pairs/resistor_tail_npn', 'shifters/new_one']);
    expect(rows[0].querySelector('.vetted')?.textContent?.trim()).toBe('✓ vetted v3');
    expect(rows[0].querySelector('nw-state-chip')?.textContent?.trim()).toContain('v4 · In review');
    expect(rows[0].querySelector('a.path')?.getAttribute('href')).toBe('/library/mirrors/wilson_npn');
    expect(rows[0].querySelector('.vetted')?.getAttribute('href')).toBe('/library/mirrors/wilson_npn/3');
    expect(rows[1].querySelector('nw-state-chip')).toBeNull();
    expect(rows[2].textContent).toContain('not vetted yet');
    expect(rows[2].querySelector('nw-state-chip')?.textContent).toContain('v1 · Draft');
    expect([...el.querySelectorAll('mat-chip-option')].map((c) => c.textContent?.trim())).toEqual(['All categories', 'mirrors', 'pairs', 'shifters']);
    expect(el.textContent).toContain('5 min ago');
    expect(el.textContent).toContain('Propose a block');
    expect(el.textContent).not.toContain('Review queue');
  });

  it('searches after a pause in typing, and filters by category, state and tag on the server', async () => {
    const { harness, el } = await open('viewer');
    listCall().flush({ items: [block('mirrors/wilson_npn', 3, { version: 3, state: 'vetted' }, ['npn'])], total: 1 });
    await settle(harness);
    expect(el.textContent).not.toContain('Propose a block');

    const input = el.querySelector('input[type="search"]') as HTMLInputElement;
    for (const text of ['wi', 'wils']) {
      input.value = text;
      input.dispatchEvent(new Event('input'));
    }
    http.expectNone((r) => r.url === '/api/workspaces/strainlab/blocks'); // not on every keystroke
    await new Promise((done) => setTimeout(done, SEARCH_PAUSE_MS + 50));
    await settle(harness);
    const searched = listCall();
    expect(searched.request.params.toString()).toBe('q=wils');
    searched.flush({ items: [block('mirrors/wilson_npn', 3, { version: 3, state: 'vetted' }, ['npn'])], total: 1 });
    await settle(harness);

    (el.querySelector('mat-chip-option:nth-of-type(2) button, mat-chip-option:nth-of-type(2) .mdc-evolution-chip__action') as HTMLElement).click();
    await settle(harness);
    const byCategory = listCall();
    expect(byCategory.request.params.toString()).toBe('q=wils&category=mirrors');
    byCategory.flush({ items: [], total: 0 });
    await settle(harness);
    expect(el.querySelector('.empty')?.textContent).toContain('No block matches these filters');
    // The chips stay though the answer was empty: they come from every block seen.
    expect([...el.querySelectorAll('mat-chip-option')].map((c) => c.textContent?.trim())).toEqual(['All categories', 'mirrors']);

    const vetted = [...el.querySelectorAll('mat-button-toggle button')].find((b) => b.textContent?.trim() === 'Vetted') as HTMLButtonElement;
    vetted.click();
    await settle(harness);
    const byState = listCall();
    expect(byState.request.params.toString()).toBe('q=wils&category=mirrors&state=vetted');
    byState.flush({ items: [block('mirrors/wilson_npn', 3, { version: 3, state: 'vetted' }, ['npn'])], total: 1 });
    await settle(harness);

    (el.querySelector('button.tag') as HTMLButtonElement).click();
    await settle(harness);
    expect(listCall().request.params.toString()).toBe('q=wils&category=mirrors&state=vetted&tag=npn');
  });

  it('shows reviewers their queue with its length, under the workspace the address names', async () => {
    const { harness, el } = await open('reviewer', '/w/strainlab/library');
    listCall().flush({ items: [], total: 0 });
    http.expectOne('/api/workspaces/strainlab/review-queue').flush({ items: [{ path: 'a/b', title: 'B', version: 2, author: RAVI, submittedAt: new Date().toISOString(), checks: { total: 3, failing: 1 } }] });
    await settle(harness);
    const link = el.querySelector('a.queue') as HTMLAnchorElement;
    expect(link.textContent?.trim()).toBe('Review queue (1)');
    expect(link.getAttribute('href')).toBe('/w/strainlab/library/queue');
  });

  it('reads the workspace from the address, not the one last chosen', async () => {
    const { harness } = await open('reviewer', '/w/other/library');
    listCall('other').flush({ items: [], total: 0 });
    await settle(harness);
    expect(TestBed.inject(Session).workspace()?.slug).toBe('other');
  });

  it('says, offline, that the seed library still works in the bench', async () => {
    const { harness, el } = await open('designer', '/library', 'offline');
    await settle(harness);
    const note = el.querySelector('.seed')?.textContent ?? '';
    expect(note).toContain('cannot be reached');
    expect(note).toContain('seed library');
    expect(note).toContain('bench');
    expect(el.querySelector('.seed a')?.getAttribute('href')).toBe('/bench');
  });

  it('says, signed out, that the seed library still works in the bench', async () => {
    const { harness, el } = await open('designer', '/library', 'signed-out');
    await settle(harness);
    expect(el.querySelector('.seed')?.textContent).toContain('needs you signed in');
    expect(el.textContent).toContain('Sign in');
  });
});
