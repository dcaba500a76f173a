/**
 * Splits netlist text into logical lines: comments removed, `\` continuations joined, and a
 * position map so that every character of a logical line points back at its physical line and
 * column (diagnostics on continued lines must land on the right physical place).
 */
import type { SourceLoc } from '../circuit/diagnostic';

/** One segment of a logical line that came from one physical line. */
interface Segment {
  /** Index in the logical text where this segment starts. */
  start: number;
  /** 1-based physical line. */
  line: number;
  /** 1-based physical column of the segment's first character. */
  col: number;
}

/** A statement's text after comment stripping and continuation joining. */
export class LogicalLine {
  constructor(
    readonly text: string,
    private readonly segments: Segment[],
  ) {}

  /** 1-based physical line where the statement starts. */
  get line(): number {
    return this.segments[0].line;
  }

  /** Source location of the character at `index` in `text` (clamped to the text). */
  loc(index: number, endIndex?: number): SourceLoc {
    const i = Math.max(0, Math.min(index, Math.max(0, this.text.length)));
    let lo = 0;
    let hi = this.segments.length - 1;
    while (lo < hi) {
      const mid = (lo + hi + 1) >> 1;
      if (this.segments[mid].start <= i) lo = mid;
      else hi = mid - 1;
    }
    const seg = this.segments[lo];
    const col = seg.col + (i - seg.start);
    const out: SourceLoc = { line: seg.line, col: Math.max(1, col) };
    if (endIndex !== undefined && endIndex > index) {
      const end = this.loc(endIndex - 1);
      if (end.line === out.line) out.endCol = end.col + 1;
    }
    return out;
  }
}

/** Index of the `#` that starts a comment, or -1. `#` has no other meaning in the language. */
function commentStart(line: string): number {
  return line.indexOf('#');
}

/**
 * Logical lines of `text`, blank ones dropped. A line whose last non-blank character before any
 * comment is `\` continues on the next physical line; the `\` becomes a space.
 */
export function splitLogicalLines(text: string): LogicalLine[] {
  const physical = text.split(/\r\n|\n|\r/);
  const result: LogicalLine[] = [];
  let buffer = '';
  let segments: Segment[] = [];
  for (let n = 0; n < physical.length; n++) {
    let raw = physical[n];
    const hash = commentStart(raw);
    if (hash >= 0) raw = raw.slice(0, hash);
    // trimEnd, not replace(/\s+$/): the regex retries from every space of a long run that is
    // followed by more text, which is quadratic in the run (a 128k-space line took 20 s).
    const trimmedEnd = raw.trimEnd();
    const continues = trimmedEnd.endsWith('\\');
    const body = continues ? trimmedEnd.slice(0, -1) + ' ' : raw;
    segments.push({ start: buffer.length, line: n + 1, col: 1 });
    buffer += body;
    if (continues && n < physical.length - 1) continue;
    if (buffer.trim().length > 0) result.push(new LogicalLine(buffer, segments));
    buffer = '';
    segments = [];
  }
  return result;
}
