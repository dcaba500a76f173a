import { TestBed } from '@angular/core/testing';
import { provideRouter, withComponentInputBinding } from '@angular/router';
import { RouterTestingHarness } from '@angular/router/testing';
import { Session } from '../core/session';
import type { Role } from '../core/team-api';
import { LibraryApi } from './library-api';
import { LIBRARY_ROUTES } from './library.routes';
import { ADA, FakeLibraryApi, MEI } from './testing/fake-library-api';

describe('ReviewQueuePage', () => {
  let api: FakeLibraryApi;

  async function open(role: Role) {
    TestBed.configureTestingModule({
      providers: [provideRouter([{ path: 'w/:slug/library', children: LIBRARY_ROUTES }], withComponentInputBinding()), { provide: LibraryApi, useValue: api }],
    });
    const session = TestBed.inject(Session);
    session.me.set({ user: ADA, workspaces: [{ slug: 'strainlab', name: 'Strainlab', role }] });
    session.state.set('signed-in');
    const harness = await RouterTestingHarness.create();
    await harness.navigateByUrl('/w/strainlab/library/queue');
    await new Promise((done) => setTimeout(done));
    await harness.fixture.whenStable();
    return harness.routeNativeElement as HTMLElement;
  }

  beforeEach(() => {
    api = new FakeLibraryApi();
    api.add('mirrors/wilson_npn', { source: 'x', state: 'in_review', submitted: true, author: MEI, checks: [
      { line: 20, text: 'ratio = 1 ± 1%', pass: true, value: 1 }, { line: 21, text: 'rout >= 1meg', pass: false, value: 4e5 },
    ] }, 'Wilson npn mirror');
    api.add('mirrors/mine', { source: 'x', state: 'in_review', submitted: true, author: ADA, checks: [] });
  });

  it('lists versions in review by others with their author and the author’s checks, each linking to its page', async () => {
    const el = await open('reviewer');
    const rows = [...el.querySelectorAll('tr.mat-mdc-row')];
    expect(rows).toHaveLength(1);
    expect(rows[0].querySelector('a.path')?.textContent).toBe('mirrors/wilson_npn@1');
    expect(rows[0].querySelector('a.path')?.getAttribute('href')).toBe('/w/strainlab/library/mirrors/wilson_npn/1');
    expect(rows[0].textContent).toContain('Mei Tanaka');
    expect(rows[0].querySelector('.checks')?.textContent).toBe('2 checks, 1 failing');
    expect(rows[0].querySelector('.checks')?.classList).toContain('failing');
  });

  it('tells a designer that reviewers vet blocks, without asking the server for a queue it would refuse', async () => {
    const spy = vi.spyOn(api, 'reviewQueue');
    const el = await open('designer');
    expect(el.querySelector('.note')?.textContent).toContain('Reviewers and admins vet blocks');
    expect(spy).not.toHaveBeenCalled();
  });
});
