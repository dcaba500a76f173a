import { parseReference } from './reference-doc';
import { countShown, highlight, narrow, queryWords } from './reference-search';
import { SAMPLE_REFERENCE } from './testing/sample-reference';

describe('reference search', () => {
  const doc = parseReference(SAMPLE_REFERENCE);

  it('shows everything for an empty query', () => {
    const all = narrow(doc, queryWords('   '));
    expect(all.map((v) => v.chapter.id)).toEqual(doc.chapters.map((c) => c.id));
    expect(countShown(all)).toBe(4 + 3);
  });

  it('narrows to the sections that mention every word, case aside', () => {
    const views = narrow(doc, queryWords('Analyze NOISE'));
    expect(views.map((v) => v.chapter.id)).toEqual(['analyses']);
    expect(views[0].showBody).toBe(false);
    expect(views[0].sections.map((s) => s.id)).toEqual(['later-analyses']);
    expect(countShown(views)).toBe(1);
    // A heading word counts as well as the body.
    expect(narrow(doc, queryWords('transfer')).flatMap((v) => v.sections.map((s) => s.id))).toEqual(['analyze-transfer']);
    expect(narrow(doc, queryWords('noise gigahertz'))).toEqual([]);
  });

  it('marks each hit in the text, never inside the markup', () => {
    const html = '<p>A <code class="x">code</code> example: code here.</p>';
    const marked = highlight(html, ['code']);
    expect(marked).toBe('<p>A <code class="x"><mark>code</mark></code> example: <mark>code</mark> here.</p>');
    expect(highlight('<p>Analyze ac</p>', ['analyze', 'ac'])).toBe('<p><mark>Analyze</mark> <mark>ac</mark></p>');
    expect(highlight('<p>a+b (c)</p>', ['+b', '('])).toBe('<p>a<mark>+b</mark> <mark>(</mark>c)</p>');
    expect(highlight(html, [])).toBe(html);
  });
});
