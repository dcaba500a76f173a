/**
 * The seed block library: every manifest entry resolves, its file holds one block named after
 * the path's last segment under a `#:` doc comment (title, summary, pins, params, tags), written
 * in the Nodewright language, and the block elaborates when instantiated. The fixtures and their
 * checks are solved in seed-blocks.test.ts.
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { parseNetlist } from '../../solver/index';
import { createLibraryResolver, defaultLibraryDir, readManifest } from '../../tools/library-resolver';

const dir = defaultLibraryDir();
const manifest = readManifest(dir);
const lookup = createLibraryResolver(dir);

describe('seed library', () => {
  it('has the seed blocks', () => {
    expect(manifest.blocks.length).toBeGreaterThanOrEqual(12);
    expect(new Set(manifest.blocks.map((b) => `${b.path}@${b.version}`)).size).toBe(manifest.blocks.length);
    expect(manifest.blocks.map((b) => `${b.path}@${b.version}`)).toContain('mirrors/wilson_npn@3');
  });

  it.each(manifest.blocks.map((b) => [`${b.path}@${b.version}`, b]))('%s is a well-formed block', (_label, entry) => {
    const b = entry as (typeof manifest.blocks)[number];
    const text = readFileSync(join(dir, b.file), 'utf8');
    expect(text.startsWith('#:')).toBe(true);
    expect(b.summary.length).toBeGreaterThan(10);
    expect((b as { title?: string }).title?.length ?? 0).toBeGreaterThan(5);
    expect(b.file).toBe(`${b.path}@${b.version}.nwl`);
    expect(b.path.split('/')[0]).toBe(b.category);
    // The language's own syntax: no dot-commands, no three-letter mega.
    expect(text).not.toMatch(/^\s*\./m);
    expect(text).not.toMatch(/\dmeg\b/i);
    const blocks = [...text.matchAll(/^\s*block\s+(\w+)\(([^)]*)\)/gm)];
    expect(blocks).toHaveLength(1);
    const name = blocks[0][1];
    expect(name).toBe(b.path.split('/').pop());
    const pins = blocks[0][2].split(',').map((p) => p.trim());
    const found = lookup(b.path, b.version);
    expect(found.ok).toBe(true);
    // Instantiate with every pin on its own node, each tied to ground by a resistor.
    const netlist = [
      `use ${b.path}@${b.version}`,
      `x1: ${name}(${pins.map((p) => `${p}=n_${p}`).join(', ')})`,
      ...pins.map((p) => `r_${p}: res(n_${p}, gnd) 1k`),
    ].join('\n');
    const parsed = parseNetlist(netlist, { resolveUse: lookup });
    expect(parsed.diagnostics.filter((d) => d.severity === 'error')).toEqual([]);
    expect(parsed.circuit?.parts.some((p) => p.name.startsWith('x1.'))).toBe(true);
  });

  it('a missing version or block is a diagnostic with the published versions as hint', () => {
    const r = parseNetlist('use mirrors/wilson_npn@9\nm: wilson_npn(in=a, out=b, rail=gnd)', { resolveUse: lookup });
    const e = r.diagnostics.find((d) => d.severity === 'error' && d.line === 1);
    expect(e?.message).toMatch(/no version 9/);
    expect(e?.hint).toMatch(/3/);
  });
});
