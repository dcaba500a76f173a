/**
 * The seed block library (`library/` in the repository, shipped with the app and cached by the
 * service worker) as the worker's `use` resolver. `solveNetlist` resolves synchronously, so the
 * files a netlist names are fetched first (and kept), then the solve runs. When the team library
 * is connected, this is where its API will be asked instead.
 */
import type { UseLookup } from '../../../solver/parse/parse-netlist';

interface ManifestEntry { path: string; version: number; file: string }

/** A `use path@version` line (path and version captured). */
export const USE_LINE = /^[ \t]*use[ \t]+([A-Za-z0-9_/]+)@(\d+)/gm;

export class SeedLibrary {
  private manifest: ManifestEntry[] | undefined;
  private readonly files = new Map<string, string>();

  constructor(private readonly base: URL) {}

  /** Fetches what `text` uses (and what those files use). Never throws: failures show at resolve. */
  async preload(text: string): Promise<void> {
    const wanted = [...text.matchAll(USE_LINE)].map((m) => `${m[1]}@${m[2]}`);
    if (wanted.length === 0) return;
    try {
      this.manifest ??= ((await (await fetch(new URL('manifest.json', this.base))).json()) as { blocks: ManifestEntry[] }).blocks;
    } catch {
      return;
    }
    for (let i = 0; i < wanted.length && i < 64; i++) {
      const key = wanted[i];
      const entry = this.entry(key);
      if (!entry || this.files.has(key)) continue;
      try {
        const res = await fetch(new URL(entry.file, this.base));
        if (!res.ok) continue;
        const body = await res.text();
        this.files.set(key, body);
        wanted.push(...[...body.matchAll(USE_LINE)].map((m) => `${m[1]}@${m[2]}`));
      } catch {
        /* offline and not cached: reported by resolve() */
      }
    }
  }

  /** The synchronous resolver handed to the solver. */
  readonly resolve = (path: string, version: number): UseLookup => {
    const key = `${path}@${version}`;
    const text = this.files.get(key);
    if (text !== undefined) return { ok: true, text };
    if (!this.manifest) {
      return { ok: false, message: `\`${key}\` cannot be fetched: the block library did not load.`, hint: 'reload the bench once while the server is reachable' };
    }
    const versions = this.manifest.filter((e) => e.path === path).map((e) => e.version);
    if (versions.length) return { ok: false, message: `The library has no version ${version} of \`${path}\`.`, hint: `published: ${versions.map((v) => `@${v}`).join(', ')}` };
    return { ok: false, message: `The library has no block \`${path}\`.`, hint: `blocks: ${this.manifest.map((e) => e.path).join(', ')}` };
  };

  private entry(key: string): ManifestEntry | undefined {
    return this.manifest?.find((e) => `${e.path}@${e.version}` === key);
  }
}
