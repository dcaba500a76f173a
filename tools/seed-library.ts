/**
 * Loads the seed block library (`library/`, listed in its manifest) into the demo workspace as
 * vetted versions, idempotently: a block or version already there is left as it is (a published
 * version never changes). Each version's checks are solved here, with the project's own solver,
 * and stored as the author's checks would be.
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import type { DataSource } from 'typeorm';
import { solveNetlist } from '../solver';
import { readBlockSource } from '../api/services/block-source';
import { DEMO_WORKSPACE } from '../api/services/seed';
import { createLibraryResolver, defaultLibraryDir, readManifest } from './library-resolver';

/** Who the seed versions are written and vetted by, in the demo workspace. */
const SEED_AUTHOR = 'ada@strainlab.example';
const SEED_REVIEWER = 'mei@strainlab.example';

export async function seedLibrary(ds: DataSource, dir = defaultLibraryDir()): Promise<{ blocks: number; versions: number }> {
  const manifest = readManifest(dir);
  const resolve = createLibraryResolver(dir);
  let added = 0;
  await ds.transaction(async (m) => {
    const [ws] = await m.query(`SELECT id FROM workspaces WHERE slug = $1`, [DEMO_WORKSPACE.slug]);
    const [author] = await m.query(`SELECT id FROM users WHERE email = $1`, [SEED_AUTHOR]);
    const [reviewer] = await m.query(`SELECT id FROM users WHERE email = $1`, [SEED_REVIEWER]);
    for (const entry of manifest.blocks) {
      const source = readFileSync(join(dir, entry.file), 'utf8');
      const facts = readBlockSource(entry.path, source);
      const title = (entry as { title?: string }).title ?? facts.title ?? entry.path.split('/')[1];
      const [block] = await m.query(
        `INSERT INTO blocks (workspace_id, path, title, summary, tags, created_by) VALUES ($1, $2, $3, $4, $5, $6)
         ON CONFLICT (workspace_id, path) DO UPDATE SET path = EXCLUDED.path RETURNING id`,
        [ws.id, entry.path, title, entry.summary ?? facts.summary ?? '', entry.tags ?? facts.tags, author.id],
      );
      const exists: unknown[] = await m.query(`SELECT 1 FROM block_versions WHERE block_id = $1 AND version = $2`, [block.id, entry.version]);
      if (exists.length) continue;
      const result = solveNetlist(source, { resolveUse: (p, v) => resolve(p, v) });
      const checks = result.checks.map((c) => ({ line: c.line, text: c.text, pass: c.pass, value: Number.isFinite(c.value) ? c.value : null }));
      await m.query(
        `INSERT INTO block_versions (block_id, version, state, source, pins, params, checks, author_id, submitted_at, decided_at, decided_by)
         VALUES ($1, $2, 'vetted', $3, $4, $5, $6, $7, now(), now(), $8)`,
        [block.id, entry.version, source, JSON.stringify(facts.pins), JSON.stringify(facts.params), JSON.stringify(checks), author.id, reviewer.id],
      );
      added++;
    }
  });
  return { blocks: new Set(manifest.blocks.map((b) => b.path)).size, versions: added };
}
