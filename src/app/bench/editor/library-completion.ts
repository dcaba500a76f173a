/**
 * Completion of `use` lines from the block library: after `use ` the library's paths (vetted
 * blocks first, the title beside each, the summary as info), after `use path@` that block's
 * versions, newest first, the newest vetted one on top and retired ones at the bottom.
 */
import { completionStatus, startCompletion, type Completion, type CompletionContext, type CompletionResult, type CompletionSource } from '@codemirror/autocomplete';
import type { EditorView } from '@codemirror/view';
import { STATE_CHIP } from '../../library/block-words';
import type { LibraryEntry } from '../solver-protocol';

/** `use ` and the path typed so far. */
const USE_PATH = /^\s*use\s+([A-Za-z0-9_/]*)$/;
/** `use path@` and the version digits typed so far. */
const USE_VERSION = /^\s*use\s+([A-Za-z0-9_/]+)@(\d*)$/;

/** What completes the text of a line before the cursor: options and how many characters they replace. */
export interface LibraryCompletions {
  options: Completion[];
  /** Length of the path or version already typed (replaced by the option). */
  typed: number;
  /** The path whose versions are offered. */
  versionsOf?: string;
}

/** Paths with a vetted version come first; blocks with nothing but retired versions last. */
function pathBoost(entry: LibraryEntry): number {
  if (entry.versions.some((v) => v.state === 'vetted')) return 1;
  return entry.versions.length > 0 && entry.versions.every((v) => v.state === 'retired') ? -1 : 0;
}

function pathOption(entry: LibraryEntry, atFollows: boolean): Completion {
  return {
    label: entry.path,
    type: 'class',
    detail: entry.title || undefined,
    info: entry.summary || undefined,
    // Straight on to the version, unless the line already has one after the cursor.
    apply: atFollows ? entry.path : `${entry.path}@`,
    boost: pathBoost(entry),
  };
}

/**
 * The versions of one block in the order they are offered: the newest vetted, the other usable
 * ones newest first, then the retired ones newest first.
 */
export function versionOrder(versions: LibraryEntry['versions']): LibraryEntry['versions'] {
  const sorted = [...versions].sort((a, b) => b.version - a.version);
  const newestVetted = sorted.find((v) => v.state === 'vetted');
  const live = sorted.filter((v) => v !== newestVetted && v.state !== 'retired');
  const retired = sorted.filter((v) => v.state === 'retired');
  return [...(newestVetted ? [newestVetted] : []), ...live, ...retired];
}

function versionOptions(entry: LibraryEntry): Completion[] {
  const newestVetted = entry.versions.filter((v) => v.state === 'vetted').reduce((n, v) => Math.max(n, v.version), 0);
  return versionOrder(entry.versions).map((v, index) => {
    const chip = STATE_CHIP[v.state];
    const words = `${chip?.symbol ?? ''} ${chip ? chip.label.toLowerCase() : v.state}`.trim();
    return {
      label: String(v.version),
      type: 'constant',
      detail: v.version === newestVetted ? `${words} · newest vetted` : words,
      info: chip?.meaning,
      // Rank beats how well the digits match, so the order above holds while typing.
      boost: Math.max(-99, 99 - index),
    };
  });
}

/**
 * The completions for the text of a line before the cursor, or undefined when it is not a
 * `use` line waiting for a path or a version. `after` is the text right after the cursor.
 */
export function libraryCompletionsFor(before: string, library: readonly LibraryEntry[], after = ''): LibraryCompletions | undefined {
  let m = USE_VERSION.exec(before);
  if (m) {
    const entry = library.find((e) => e.path === m![1]);
    return entry ? { options: versionOptions(entry), typed: m[2].length, versionsOf: entry.path } : undefined;
  }
  m = USE_PATH.exec(before);
  if (!m || library.length === 0) return undefined;
  const atFollows = /^[A-Za-z0-9_/]*@/.test(after);
  return { options: library.map((e) => pathOption(e, atFollows)), typed: m[1].length };
}

/**
 * A CodeMirror completion source over the library `library()` returns at the time of asking.
 * `wantVersions(path)` is told when the versions of a path are offered, so the full list can be
 * fetched (the catalogue names only the newest and the newest vetted).
 */
export function libraryCompletion(library: () => readonly LibraryEntry[], wantVersions?: (path: string) => void): CompletionSource {
  return (context: CompletionContext): CompletionResult | null => {
    const line = context.state.doc.lineAt(context.pos);
    const before = line.text.slice(0, context.pos - line.from);
    const found = libraryCompletionsFor(before, library(), line.text.slice(context.pos - line.from));
    if (!found) return null;
    if (found.versionsOf) wantVersions?.(found.versionsOf);
    if (found.options.length === 0) return null;
    return { from: context.pos - found.typed, options: found.options, validFor: found.versionsOf ? /^\d*$/ : /^[A-Za-z0-9_/]*$/ };
  };
}

/** Picking a path (which ends in `@`) opens the versions at once. */
export function continuesWithVersions(completion: Completion): boolean {
  return typeof completion.apply === 'string' && completion.apply.endsWith('@');
}

/** Asks again when the library changed under an open version list (the full list has arrived). */
export function refreshVersionCompletion(view: EditorView): void {
  if (completionStatus(view.state) !== 'active') return;
  const head = view.state.selection.main.head;
  const line = view.state.doc.lineAt(head);
  if (USE_VERSION.test(line.text.slice(0, head - line.from))) startCompletion(view);
}
