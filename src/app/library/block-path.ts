/**
 * A new block's path and tags, checked as the server checks them (api/routes/library.ts), and the
 * source a proposal starts from, written in the block doc convention (`#:` lines above the block:
 * title, summary, `pin`, `param`, `tags`; see solver/parse/block-doc.ts).
 */
import { readBlockDocs } from '../../../solver';

/** category/name: lower case letters, digits and `_`, each part starting with a letter. */
export const BLOCK_PATH = /^[a-z][a-z0-9_]{0,39}\/[a-z][a-z0-9_]{0,59}$/;
export const TAG_MAX = 40;
export const TAGS_MAX = 20;

/** The path as it will be stored, or a sentence saying why it cannot be. */
export function checkBlockPath(raw: string): { path: string } | { problem: string } {
  const path = raw.trim();
  if (!path) return { problem: 'Give the block a path: category/name, for example mirrors/wilson_npn.' };
  const parts = path.split('/');
  if (parts.length !== 2 || !parts[0] || !parts[1]) return { problem: 'A path is two parts, category/name, for example mirrors/wilson_npn.' };
  const [category, name] = parts;
  for (const [part, what, max] of [[category, 'category', 40], [name, 'name', 60]] as const) {
    if (part.length > max) return { problem: `The ${what} has at most ${max} characters; “${part}” has ${part.length}.` };
    if (!/^[a-z]/.test(part)) return { problem: `The ${what} must start with a lower-case letter: “${part}”.` };
    const bad = /[^a-z0-9_]/.exec(part);
    if (bad) return { problem: `The ${what} may use only lower-case letters, digits and _; “${bad[0]}” is not allowed.` };
  }
  return BLOCK_PATH.test(path) ? { path } : { problem: 'A path is category/name in lower-case letters, digits and _.' };
}

/** Tags typed as "npn, mirror, bipolar": trimmed, without repeats, or a sentence saying what is wrong. */
export function parseTags(raw: string): { tags: string[] } | { problem: string } {
  const tags: string[] = [];
  for (const t of raw.split(',').map((s) => s.trim()).filter(Boolean)) if (!tags.includes(t)) tags.push(t);
  const long = tags.find((t) => t.length > TAG_MAX);
  if (long) return { problem: `A tag has at most ${TAG_MAX} characters; “${long.slice(0, 24)}…” has ${long.length}.` };
  if (tags.length > TAGS_MAX) return { problem: `At most ${TAGS_MAX} tags; there are ${tags.length}.` };
  return { tags };
}

/**
 * The source a proposal starts from: a documented block with two pins and a param, and a small
 * fixture that solves it on its own with a measure and a check, so Submit has checks to send.
 */
export function blockTemplate(path: string): string {
  const name = path.includes('/') ? path.slice(path.indexOf('/') + 1) || 'my_block' : path || 'my_block';
  return `#: One line saying what the block is
#: A few sentences on how it behaves and what it expects: bias, headroom, the figure it sets.
#: pin a — what this pin connects to
#: pin b — what this pin connects to
#: param r — what this param sets
#: tags passive

block ${name}(a, b)
  param r = 10k
  r1: res(a, b) r
end

# ── Fixture: what this file solves on its own. A netlist that says \`use …\` takes only the
# block and its models; everything below stays here.
title  ${name}: fixture

vs:    vsrc(in, gnd) 1
b1:    ${name}(a=in, b=gnd) r=10k

measure rin = zin(vs)

check  rin = 10k ± 1%
`;
}

/**
 * Whether `source` defines the block `name` (the server refuses a source that does not, 400
 * `block_not_defined`), with what its doc comment lacks (shown, not refused).
 */
export function blockDocCheck(source: string, name: string): { defined: true; title?: string; problems: string[] } | { defined: false; problem: string } {
  const docs = readBlockDocs(source);
  const doc = docs.find((d) => d.name === name);
  if (!doc) {
    const found = docs.map((d) => d.name).join(', ');
    return { defined: false, problem: `The source must define \`block ${name}(…)\`, the last part of the path${found ? `; it defines ${found}` : ''}.` };
  }
  return { defined: true, ...(doc.title ? { title: doc.title } : {}), problems: doc.problems };
}
