import { anchorsOf, parseReference, slugOf } from './reference-doc';
import { SAMPLE_REFERENCE } from './testing/sample-reference';

describe('slugOf', () => {
  it('drops the chapter number and joins the words with -', () => {
    expect(slugOf('5. Analyses')).toBe('analyses');
    expect(slugOf('2. Lines, names, numbers')).toBe('lines-names-numbers');
    expect(slugOf('analyze ac')).toBe('analyze-ac');
    expect(slugOf('use: blocks from the library')).toBe('use-blocks-from-the-library');
    expect(slugOf('12. Decisions where the language definition is silent')).toBe('decisions-where-the-language-definition-is-silent');
    expect(slugOf('…')).toBe('section');
  });
});

describe('parseReference', () => {
  const doc = parseReference(SAMPLE_REFERENCE);

  it('takes the title, the intro and the chapters with their sections', () => {
    expect(doc.title).toBe('Writing netlists');
    expect(doc.introHtml).toContain('<code>.nwl</code>');
    expect(doc.introHtml).toContain('<blockquote>');
    expect(doc.chapters.map((c) => c.id)).toEqual(['a-first-netlist', 'analyses', 'measures', 'diagnostics']);
    expect(doc.chapters.map((c) => c.title)).toEqual(['1. A first netlist', '5. Analyses', '7. Measures', '9. Diagnostics']);
    const analyses = doc.chapters[1];
    expect(analyses.sections.map((s) => s.id)).toEqual(['analyze-ac', 'analyze-transfer', 'later-analyses']);
    expect(analyses.text).toBe('The operating point is always solved.');
    expect(analyses.sections[0].html).toContain('<pre><code>analyze ac from 10 Hz to 1 GHz per decade 20');
    expect(analyses.sections[2].text).toContain('analyze noise and analyze poles parse today');
    expect(anchorsOf(doc).has('later-analyses')).toBe(true);
  });

  it('renders tables and inline code, and keeps no script, handler or foreign markup', () => {
    const measures = doc.chapters[2];
    expect(measures.html).toContain('<table>');
    expect(measures.html).toContain('<code>db(x)</code>');
    const diagnostics = doc.chapters[3].html;
    expect(diagnostics).not.toContain('<script');
    expect(diagnostics).not.toContain('onerror');
    expect(diagnostics).not.toContain('alert(2)');
  });

  it('gives a repeated heading its own anchor', () => {
    const twice = parseReference('# T\n\n## 1. Parts\n\nx\n\n## 2. Parts\n\ny\n');
    expect(twice.chapters.map((c) => c.id)).toEqual(['parts', 'parts-2']);
  });
});
