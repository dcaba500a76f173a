/**
 * The language reference (docs/netlist.md) as the app shows it: Markdown rendered by `marked`,
 * every piece of HTML sanitized by DOMPurify, cut into chapters (##) and sections (###) whose
 * headings get stable anchors, so a diagnostic's "Syntax" link and a search can point at them.
 */
import DOMPurify from 'dompurify';
import { Marked, type Token, type Tokens } from 'marked';

/** One `###` section, or the text of a chapter before its first section. */
export interface ReferenceSection {
  /** The heading's anchor, e.g. `analyze-ac` (see slugOf). */
  id: string;
  /** Plain heading text, e.g. "analyze ac". */
  title: string;
  /** The heading as sanitized inline HTML (keeps `code`). */
  titleHtml: string;
  /** The body as sanitized HTML. */
  html: string;
  /** The body as plain text, for searching. */
  text: string;
}

/** One `##` chapter with its `###` sections. */
export interface ReferenceChapter extends ReferenceSection {
  sections: ReferenceSection[];
}

export interface ReferenceDoc {
  /** The `#` heading. */
  title: string;
  /** What stands before the first chapter (sanitized HTML). */
  introHtml: string;
  chapters: ReferenceChapter[];
}

const markdown = new Marked({ gfm: true });

/**
 * The anchor of a heading: lower case, words joined by `-`, with the chapter number dropped
 * ("5. Analyses" → `analyses`) so links keep working when chapters are renumbered.
 */
export function slugOf(heading: string): string {
  return heading
    .replace(/^\s*\d+(\.\d+)*\.?\s+/, '')
    .toLowerCase()
    .normalize('NFKD')
    .replace(/[^a-z0-9]+/g, '-')
    .replace(/^-+|-+$/g, '') || 'section';
}

/** Sanitized HTML: whatever the Markdown holds, no script, handler or foreign element survives. */
export function sanitize(html: string): string {
  return DOMPurify.sanitize(html);
}

/** The text a piece of (sanitized) HTML shows. */
export function textOf(html: string): string {
  const t = document.createElement('template');
  t.innerHTML = html;
  return (t.content.textContent ?? '').replace(/\s+/g, ' ').trim();
}

/** Plain text of a heading token (inline code and emphasis without their marks). */
function headingText(token: Tokens.Heading): string {
  return textOf(sanitize(markdown.parseInline(token.text, { async: false })));
}

function section(id: string, heading: Tokens.Heading | undefined, body: Token[]): ReferenceSection {
  const html = sanitize(markdown.parser(body, { async: false }));
  return {
    id,
    title: heading ? headingText(heading) : '',
    titleHtml: heading ? sanitize(markdown.parseInline(heading.text, { async: false })) : '',
    html,
    text: textOf(html),
  };
}

/** Cuts the reference into chapters and sections; anchors are unique (a repeat gets `-2`, `-3` …). */
export function parseReference(source: string): ReferenceDoc {
  const used = new Map<string, number>();
  const anchor = (heading: Tokens.Heading): string => {
    const base = slugOf(headingText(heading));
    const n = (used.get(base) ?? 0) + 1;
    used.set(base, n);
    return n === 1 ? base : `${base}-${n}`;
  };

  let title = '';
  const intro: Token[] = [];
  const chapters: ReferenceChapter[] = [];
  let chapter: { heading: Tokens.Heading; id: string; body: Token[]; sections: Array<{ heading: Tokens.Heading; id: string; body: Token[] }> } | undefined;
  const flush = (): void => {
    if (!chapter) return;
    chapters.push({
      ...section(chapter.id, chapter.heading, chapter.body),
      sections: chapter.sections.map((s) => section(s.id, s.heading, s.body)),
    });
  };

  for (const token of markdown.lexer(source)) {
    if (token.type === 'heading' && token.depth === 1 && !title && !chapter) {
      title = headingText(token as Tokens.Heading);
    } else if (token.type === 'heading' && token.depth === 2) {
      flush();
      const heading = token as Tokens.Heading;
      chapter = { heading, id: anchor(heading), body: [], sections: [] };
    } else if (token.type === 'heading' && token.depth === 3 && chapter) {
      const heading = token as Tokens.Heading;
      chapter.sections.push({ heading, id: anchor(heading), body: [] });
    } else if (chapter) {
      (chapter.sections.at(-1)?.body ?? chapter.body).push(token);
    } else {
      intro.push(token);
    }
  }
  flush();
  return { title: title || 'Language reference', introHtml: sanitize(markdown.parser(intro, { async: false })), chapters };
}

/** Every anchor of the document, chapters and sections. */
export function anchorsOf(doc: ReferenceDoc): Set<string> {
  return new Set(doc.chapters.flatMap((c) => [c.id, ...c.sections.map((s) => s.id)]));
}
