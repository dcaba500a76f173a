/**
 * The block library's reads in `npm run load`: what the catalogue page, the block page and the
 * bench ask of the server, over the seed library that `prepareDatabase` loads into the demo
 * workspace (library/manifest.json, as for `npm start`). Nobody changes the library during the
 * load, so every answer is known beforehand: each request carries a check of its body, and a fast
 * wrong answer (an empty catalogue, another block) counts as an error instead of as speed.
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { defaultLibraryDir, readManifest } from '../library-resolver';
import type { LibraryKind } from './tally';

/** One request to send: its kind (for the figures), its path, and what its 2xx body must be. */
export interface LibraryRead {
  kind: LibraryKind;
  path: string;
  expect: (body: any) => boolean;
}

interface SeedBlock {
  path: string;
  category: string;
  version: number;
  title: string;
  summary: string;
  tags: string[];
  source: string;
}

/**
 * Shares of the library reads: the catalogue is opened bare more often than searched; the block
 * page and a version follow a click in it; the bench resolves `use` lines when a netlist opens
 * (a browser keeps a resolved version 60 s, so fewer of those reach the server).
 */
const MIX: [LibraryKind, number][] = [
  ['catalogue', 0.16],
  ['catalogueSearch', 0.12],
  ['catalogueCategory', 0.08],
  ['catalogueSearchCategory', 0.04],
  ['block', 0.25],
  ['version', 0.2],
  ['use', 0.15],
];

function pick<T>(items: readonly T[]): T {
  return items[Math.floor(Math.random() * items.length)];
}

/** The seed blocks as the seed loads them (tools/seed-library.ts: title and summary from the manifest). */
function seedBlocks(dir = defaultLibraryDir()): SeedBlock[] {
  return readManifest(dir).blocks.map((e) => {
    const entry = e as typeof e & { title: string };
    return { path: e.path, category: e.path.split('/')[0], version: e.version, title: entry.title, summary: e.summary, tags: e.tags, source: readFileSync(join(dir, e.file), 'utf8') };
  });
}

/** The query string as the catalogue page builds it (`catalogueParams`: q, then category). */
function catalogueQuery(q?: string, category?: string): string {
  const parts = [q && `q=${encodeURIComponent(q)}`, category && `category=${encodeURIComponent(category)}`].filter(Boolean);
  return parts.length ? `?${parts.join('&')}` : '';
}

const samePaths = (a: string[], b: string[]) => JSON.stringify([...a].sort()) === JSON.stringify([...b].sort());

/** The library reads of one workspace holding the seed library. */
export function libraryReads(workspace: string) {
  const blocks = seedBlocks();
  const categories = [...new Set(blocks.map((b) => b.category))];
  // What a designer types: the library's own tags (mixed case included: the search ignores case)
  // and one word that matches nothing.
  const terms = [...new Set(blocks.flatMap((b) => b.tags)), 'jfet'];
  const base = `/api/workspaces/${encodeURIComponent(workspace)}`;

  /** The catalogue's rows for a search: `q` in the path, title or summary (ILIKE), in the category. */
  const expected = (q?: string, category?: string) => {
    const term = q?.toLowerCase();
    return blocks
      .filter((b) => !category || b.category === category)
      .filter((b) => !term || [b.path, b.title, b.summary].some((field) => field.toLowerCase().includes(term)))
      .map((b) => b.path);
  };
  const catalogue = (kind: LibraryKind, q?: string, category?: string): LibraryRead => {
    const paths = expected(q, category);
    return { kind, path: `${base}/blocks${catalogueQuery(q, category)}`, expect: (body) => body?.total === paths.length && samePaths(body.items?.map((i: { path: string }) => i.path) ?? [], paths) };
  };

  const next = (): LibraryRead => {
    let roll = Math.random();
    const [kind] = MIX.find(([, share]) => (roll -= share) < 0) ?? MIX[MIX.length - 1];
    const b = pick(blocks);
    switch (kind) {
      case 'catalogue':
        return catalogue(kind);
      case 'catalogueSearch':
        return catalogue(kind, pick(terms));
      case 'catalogueCategory':
        return catalogue(kind, undefined, pick(categories));
      case 'catalogueSearchCategory':
        return catalogue(kind, pick(terms), pick(categories));
      case 'block':
        return { kind, path: `${base}/blocks/${b.path}`, expect: (body) => body?.path === b.path && body.vetted === b.version && body.versionsList?.length >= 1 };
      case 'version':
        return { kind, path: `${base}/blocks/${b.path}/versions/${b.version}`, expect: (body) => body?.path === b.path && body.version === b.version && body.state === 'vetted' && body.source === b.source };
      case 'use':
        return { kind, path: `${base}/library/${b.path}/${b.version}`, expect: (body) => body?.path === b.path && body.version === b.version && body.state === 'vetted' && body.newestVetted === b.version && body.source === b.source };
    }
  };

  return {
    blocks: blocks.length,
    /** A random read, by the shares of MIX. */
    next,
    /** The bare catalogue, whose answer must list every seed block: checked once before the phases. */
    whole: () => catalogue('catalogue'),
    /** The seed paths the catalogue `body` lacks (empty: the library is there). */
    missing: (body: any) => blocks.map((b) => b.path).filter((p) => !body?.items?.some((i: { path: string }) => i.path === p)),
  };
}
