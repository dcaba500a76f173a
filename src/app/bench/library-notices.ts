/**
 * What the bench says about the library versions a netlist pins: a retired version, a newer
 * vetted one, a version not vetted yet. Each is a warning on the `use` line, with a one-click
 * change of the pin where there is a vetted version to move to.
 */
import type { Diagnostic } from '../../../solver';
import type { UsedBlock } from './solver-protocol';

/** Moving a `use` line's pin from one version to another. */
export interface PinChange {
  /** 1-based line of the `use` statement. */
  line: number;
  path: string;
  from: number;
  to: number;
}

/** A warning about a pinned library version; `change` when one click can move the pin. */
export interface LibraryNotice extends Diagnostic {
  code: 'library-retired' | 'library-newer' | 'library-unvetted';
  change?: PinChange;
}

const STATE_WORDS: Record<string, string> = { draft: 'a draft', in_review: 'in review' };

/** The notices for a solved text's `use` lines (`text` places them on the version digits). */
export function libraryNotices(uses: readonly UsedBlock[], text: string): LibraryNotice[] {
  const lines = text.split('\n');
  const notices: LibraryNotice[] = [];
  for (const use of uses) {
    if (!use.state || use.line < 1) continue;
    const at = versionColumns(lines[use.line - 1] ?? '', use.path, use.version);
    const key = `\`${use.path}@${use.version}\``;
    const newest = use.newestVetted ?? null;
    const change = newest !== null && newest !== use.version ? { line: use.line, path: use.path, from: use.version, to: newest } : undefined;
    const base = { severity: 'warning' as const, line: use.line, ...at };
    if (use.state === 'retired') {
      notices.push({
        ...base, code: 'library-retired', change,
        message: `${key} is retired: its reviewers no longer stand behind it.`,
        hint: change ? `the vetted version is @${newest}` : 'no vetted version replaces it yet; ask a reviewer',
      });
    } else if (use.state !== 'vetted') {
      notices.push({
        ...base, code: 'library-unvetted',
        message: `${key} is ${STATE_WORDS[use.state] ?? use.state}, not vetted yet: its figures are unreviewed.`,
        hint: newest !== null ? `the newest vetted version is @${newest}` : 'no version of it is vetted yet',
        change: newest !== null && newest !== use.version ? change : undefined,
      });
    } else if (newest !== null && newest > use.version) {
      notices.push({
        ...base, code: 'library-newer', change,
        message: `A newer vetted version of \`${use.path}\` exists: @${newest} (this netlist pins @${use.version}).`,
        hint: 'read its changes on the block page before you move the pin',
      });
    }
  }
  return notices;
}

/** The columns of `@version` after `path` on a `use` line (the whole line's start when not found). */
function versionColumns(line: string, path: string, version: number): { col: number; endCol?: number } {
  const written = `${path}@${version}`;
  const at = line.indexOf(written);
  if (at < 0) return { col: 1 };
  const col = at + path.length + 1; // 1-based column of "@"
  return { col, endCol: col + 1 + String(version).length };
}

/** Where the version digits of a pin stand in `line` (0-based, end exclusive), if it pins `path@from`. */
export function pinDigits(line: string, change: PinChange): { from: number; to: number } | undefined {
  const m = new RegExp(`^([ \\t]*use[ \\t]+${escape(change.path)}@)${change.from}(?!\\d)`).exec(line);
  return m ? { from: m[1].length, to: m[1].length + String(change.from).length } : undefined;
}

function escape(s: string): string {
  return s.replace(/[.*+?^${}()|[\]\\]/g, '\\$&');
}
