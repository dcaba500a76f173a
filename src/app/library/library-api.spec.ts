import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { catalogueParams, LibraryApi } from './library-api';

describe('catalogueParams', () => {
  it('sends only the filters that are set, the search trimmed', () => {
    expect(catalogueParams({}).toString()).toBe('');
    expect(catalogueParams({ q: '  wilson ', category: 'mirrors', state: 'vetted', tag: ' npn ' }).toString()).toBe('q=wilson&category=mirrors&state=vetted&tag=npn');
    expect(catalogueParams({ q: '   ', tag: '' }).toString()).toBe('');
  });

  it('always writes the filters in the same order', () => {
    expect(catalogueParams({ tag: 'npn', q: 'x' }).toString()).toBe(catalogueParams({ q: 'x', tag: 'npn' }).toString());
  });

  it('encodes what is typed so the server reads it back unchanged', () => {
    const sent = catalogueParams({ q: 'a&b=c #1', tag: 'beta helper' }).toString();
    expect(new URLSearchParams(sent).get('q')).toBe('a&b=c #1');
    expect(new URLSearchParams(sent).get('tag')).toBe('beta helper');
  });
});

describe('LibraryApi', () => {
  let http: HttpTestingController;
  let api: LibraryApi;

  beforeEach(() => {
    TestBed.configureTestingModule({ providers: [provideHttpClient(), provideHttpClientTesting()] });
    http = TestBed.inject(HttpTestingController);
    api = TestBed.inject(LibraryApi);
  });
  afterEach(() => http.verify());

  it('calls the routes of docs/api.md', () => {
    void api.catalogue('strain lab', { state: 'in_review' });
    http.expectOne((r) => r.method === 'GET' && r.url === '/api/workspaces/strain%20lab/blocks' && r.params.get('state') === 'in_review').flush({ items: [], total: 0 });
    void api.version('s', 'mirrors/wilson_npn', 3);
    http.expectOne({ method: 'GET', url: '/api/workspaces/s/blocks/mirrors/wilson_npn/versions/3' }).flush({});
    void api.submit('s', 'mirrors/wilson_npn', 4, { checks: [{ line: 3, text: 'x > 0', pass: true, value: 1 }] });
    const submit = http.expectOne({ method: 'POST', url: '/api/workspaces/s/blocks/mirrors/wilson_npn/versions/4/submit' });
    expect(submit.request.body).toEqual({ checks: [{ line: 3, text: 'x > 0', pass: true, value: 1 }] });
    submit.flush({});
    void api.review('s', 'mirrors/wilson_npn', 4, { decision: 'send_back', comment: 'why' });
    http.expectOne({ method: 'POST', url: '/api/workspaces/s/blocks/mirrors/wilson_npn/versions/4/review' }).flush({});
    void api.editDraft('s', 'a/b', 1, 'text');
    http.expectOne({ method: 'PUT', url: '/api/workspaces/s/blocks/a/b/versions/1' }).flush({});
    void api.proposeVersion('s', 'a/b', 'text');
    http.expectOne({ method: 'POST', url: '/api/workspaces/s/blocks/a/b/versions' }).flush({});
    void api.retire('s', 'a/b', 2);
    http.expectOne({ method: 'POST', url: '/api/workspaces/s/blocks/a/b/versions/2/retire' }).flush({});
    void api.reviewQueue('s');
    http.expectOne({ method: 'GET', url: '/api/workspaces/s/review-queue' }).flush({ items: [] });
    void api.propose('s', { path: 'a/b', source: 'x' });
    http.expectOne({ method: 'POST', url: '/api/workspaces/s/blocks' }).flush({});
  });
});
