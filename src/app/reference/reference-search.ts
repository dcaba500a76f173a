/**
 * Searching the reference: a query narrows the chapters and sections to those that mention every
 * word of it, and marks each hit in the text.
 */
import type { ReferenceChapter, ReferenceDoc, ReferenceSection } from './reference-doc';

/** The words of a query, lower case; empty when there is nothing to search for. */
export function queryWords(query: string): string[] {
  return query.toLowerCase().split(/\s+/).filter(Boolean);
}

/** Whether a section's heading and body together hold every word. */
export function sectionMatches(section: ReferenceSection, words: readonly string[]): boolean {
  const haystack = `${section.title} ${section.text}`.toLowerCase();
  return words.every((w) => haystack.includes(w));
}

/** A chapter as a search shows it: its own text only when that matches, and its matching sections. */
export interface ChapterView {
  chapter: ReferenceChapter;
  /** The chapter's own text (before its first section) matches, or there is no query. */
  showBody: boolean;
  sections: ReferenceSection[];
}

/** The chapters and sections a query leaves; every one of them when the query is empty. */
export function narrow(doc: ReferenceDoc, words: readonly string[]): ChapterView[] {
  if (words.length === 0) return doc.chapters.map((chapter) => ({ chapter, showBody: true, sections: chapter.sections }));
  const out: ChapterView[] = [];
  for (const chapter of doc.chapters) {
    const showBody = sectionMatches(chapter, words);
    const sections = chapter.sections.filter((s) => sectionMatches(s, words));
    if (showBody || sections.length > 0) out.push({ chapter, showBody, sections });
  }
  return out;
}

/** How many sections (chapter texts counted as one each) a narrowed view shows. */
export function countShown(views: readonly ChapterView[]): number {
  return views.reduce((n, v) => n + (v.showBody ? 1 : 0) + v.sections.length, 0);
}

const escapeRegExp = (s: string) => s.replace(/[.*+?^${}()|[\]\\]/g, '\\$&');

/**
 * The HTML with every occurrence of the words wrapped in `<mark>`. Works on the DOM's text nodes,
 * never on the markup, so a word such as "code" or "class" cannot break a tag; the input is
 * already sanitized and only `mark` elements holding text are added.
 */
export function highlight(html: string, words: readonly string[]): string {
  if (words.length === 0) return html;
  const pattern = new RegExp(words.map(escapeRegExp).sort((a, b) => b.length - a.length).join('|'), 'gi');
  const t = document.createElement('template');
  t.innerHTML = html;
  const walker = document.createTreeWalker(t.content, NodeFilter.SHOW_TEXT);
  const texts: Text[] = [];
  for (let n = walker.nextNode(); n; n = walker.nextNode()) texts.push(n as Text);
  for (const node of texts) {
    const value = node.data;
    pattern.lastIndex = 0;
    if (!pattern.test(value)) continue;
    pattern.lastIndex = 0;
    const pieces = document.createDocumentFragment();
    let at = 0;
    for (let m = pattern.exec(value); m; m = pattern.exec(value)) {
      if (m.index > at) pieces.append(value.slice(at, m.index));
      const mark = document.createElement('mark');
      mark.textContent = m[0];
      pieces.append(mark);
      at = m.index + m[0].length;
    }
    if (at < value.length) pieces.append(value.slice(at));
    node.replaceWith(pieces);
  }
  return t.innerHTML;
}
