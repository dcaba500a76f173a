import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { provideRouter } from '@angular/router';
import { RouterTestingHarness } from '@angular/router/testing';
import { REFERENCE_URL, ReferencePage } from './reference-page';
import { SAMPLE_REFERENCE } from './testing/sample-reference';

// jsdom lays nothing out: scrolling to a section is a no-op there.
beforeAll(() => {
  Element.prototype.scrollIntoView ??= () => undefined;
});

/** Opens the page at an address and answers its request for the reference text. */
async function open(url: string, answer: 'text' | 'fail' = 'text') {
  TestBed.configureTestingModule({
    providers: [provideRouter([{ path: 'reference', component: ReferencePage }]), provideHttpClient(), provideHttpClientTesting()],
  });
  const harness = await RouterTestingHarness.create();
  await harness.navigateByUrl(url);
  const http = TestBed.inject(HttpTestingController);
  const req = http.expectOne(REFERENCE_URL);
  if (answer === 'text') req.flush(SAMPLE_REFERENCE);
  else req.error(new ProgressEvent('error'), { status: 0, statusText: '' });
  await harness.fixture.whenStable();
  return { harness, el: harness.routeNativeElement as HTMLElement, http };
}

const headings = (el: HTMLElement) => [...el.querySelectorAll('article h2, article h3')].map((h) => h.id);

describe('ReferencePage', () => {
  it('renders the chapters and sections with their anchors, and a table of contents linking to them', async () => {
    const { el } = await open('/reference');
    expect(el.querySelector('h1')!.textContent).toBe('Writing netlists');
    expect(headings(el)).toEqual(['a-first-netlist', 'analyses', 'analyze-ac', 'analyze-transfer', 'later-analyses', 'measures', 'diagnostics']);
    const toc = [...el.querySelectorAll('nav.toc a')].map((a) => a.getAttribute('href'));
    expect(toc).toContain('/reference#analyze-ac');
    expect(el.querySelector('article script, article img[onerror]')).toBeNull();
  });

  it('narrows to the sections that match a search and marks the hits', async () => {
    const { harness, el } = await open('/reference');
    const input = el.querySelector('input[type="search"]') as HTMLInputElement;
    input.value = 'analyze noise';
    input.dispatchEvent(new Event('input'));
    await harness.fixture.whenStable();
    expect(headings(el)).toEqual(['analyses', 'later-analyses']);
    expect([...el.querySelectorAll('article mark')].map((m) => m.textContent!.toLowerCase())).toEqual(expect.arrayContaining(['analyze', 'noise']));
    expect(el.querySelector('.count')!.textContent).toBe('1 section matches “analyze noise”');
    input.value = 'gigahertz';
    input.dispatchEvent(new Event('input'));
    await harness.fixture.whenStable();
    expect(headings(el)).toEqual([]);
    expect(el.textContent).toContain('Nothing in the reference mentions every word of “gigahertz”');
  });

  it('opens at the section an address names, or at the nearest one the text has', async () => {
    const { el } = await open('/reference#analyze-noise');
    // The sample has no noise section yet: the later analyses cover it.
    expect(el.querySelector('h3.current')!.id).toBe('later-analyses');
    expect(document.activeElement?.id).toBe('later-analyses');
  });

  it('says why when the text cannot be loaded, and offers to try again', async () => {
    const { harness, el, http } = await open('/reference', 'fail');
    expect(el.querySelector('[role="alert"]')!.textContent).toContain('could not be loaded');
    (el.querySelector('button') as HTMLButtonElement).click();
    http.expectOne(REFERENCE_URL).flush(SAMPLE_REFERENCE);
    await harness.fixture.whenStable();
    expect(el.querySelector('h1')!.textContent).toBe('Writing netlists');
  });
});
