/**
 * Resolves `use path@version` lines for the command line from a library folder: the project's
 * `library/` or one given with `--lib DIR`. The folder holds `manifest.json`:
 *
 *   { "blocks": [ { "path": "mirrors/wilson_npn", "version": 3, "file": "mirrors/wilson_npn@3.nwl",
 *                   "category": "mirrors", "tags": ["npn"], "summary": "…" } ] }
 *
 * A published version never changes, so a pinned netlist always gives the same numbers.
 */
import { existsSync, readFileSync } from 'node:fs';
import { dirname, isAbsolute, join, relative, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';

export interface ManifestEntry {
  path: string;
  version: number;
  file: string;
  category: string;
  tags: string[];
  summary: string;
}

export interface Manifest {
  blocks: ManifestEntry[];
}

/** What a lookup gives: the block file's text, or why there is none. */
export type LibraryLookup = { ok: true; text: string; file: string } | { ok: false; message: string; hint?: string };

/** The project's own library folder (next to tools/). */
export function defaultLibraryDir(): string {
  return resolve(dirname(fileURLToPath(import.meta.url)), '..', 'library');
}

/** Reads and checks a manifest; throws with a readable message when it is unusable. */
export function readManifest(dir: string): Manifest {
  const file = join(dir, 'manifest.json');
  if (!existsSync(file)) throw new Error(`no manifest.json in library folder ${dir}`);
  let data: unknown;
  try {
    data = JSON.parse(readFileSync(file, 'utf8'));
  } catch (err) {
    throw new Error(`${file} is not valid JSON: ${(err as Error).message}`);
  }
  const blocks = (data as Manifest | null)?.blocks;
  if (!Array.isArray(blocks)) throw new Error(`${file} has no "blocks" list`);
  for (const b of blocks) {
    if (typeof b?.path !== 'string' || !Number.isInteger(b?.version) || typeof b?.file !== 'string') {
      throw new Error(`${file}: every block needs "path" (text), "version" (whole number) and "file" (text)`);
    }
  }
  return { blocks };
}

/** Closest published versions of a path, for the hint when the asked one is missing. */
function versionsOf(manifest: Manifest, path: string): number[] {
  return manifest.blocks.filter((b) => b.path === path).map((b) => b.version).sort((a, b) => a - b);
}

/**
 * A resolver over one library folder. The manifest is read once; block files on demand.
 * Never throws: a broken manifest makes every lookup explain the problem.
 */
export function createLibraryResolver(dir: string): (path: string, version: number) => LibraryLookup {
  let manifest: Manifest | undefined;
  let problem: string | undefined;
  try {
    manifest = readManifest(dir);
  } catch (err) {
    problem = (err as Error).message;
  }
  return (path, version) => {
    if (!manifest) return { ok: false, message: `The block library cannot be read: ${problem}.`, hint: 'point --lib at a folder with a manifest.json' };
    const entry = manifest.blocks.find((b) => b.path === path && b.version === version);
    if (!entry) {
      const versions = versionsOf(manifest, path);
      if (versions.length > 0) {
        return { ok: false, message: `The library has no version ${version} of \`${path}\`.`, hint: `published versions: ${versions.join(', ')}` };
      }
      const paths = [...new Set(manifest.blocks.map((b) => b.path))];
      const near = paths.find((p) => p.endsWith('/' + path.split('/').pop())) ?? paths.find((p) => p.split('/')[0] === path.split('/')[0]);
      return { ok: false, message: `The library has no block \`${path}\`.`, hint: near ? `did you mean \`${near}\`?` : 'see library/manifest.json for the blocks on offer' };
    }
    const file = resolve(dir, entry.file);
    const rel = relative(resolve(dir), file);
    if (rel.startsWith('..') || isAbsolute(rel)) return { ok: false, message: `The manifest entry for \`${path}@${version}\` points outside the library folder.` };
    try {
      return { ok: true, text: readFileSync(file, 'utf8'), file };
    } catch {
      return { ok: false, message: `The library lists \`${path}@${version}\` but its file ${entry.file} cannot be read.` };
    }
  };
}
