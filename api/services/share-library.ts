/**
 * The library blocks a shared netlist uses. A reader of a share link has no session, so the link
 * carries what its `use` lines resolve to: the versions are found when the link is made (the
 * netlist's own `use` lines and those of the blocks they bring in, read with the solver's own
 * parser) and their sources are sent with the netlist when the link is opened. Only versions
 * frozen by submission are sent — a draft may still change, and then the reader's figures would
 * not be the sharer's. What the workspace lacks resolves from the seed library in the reader's
 * browser, as it did in the sharer's.
 */
import type { DataSource, EntityManager } from 'typeorm';
import { parseNetlist } from '../../solver';
import type { LibraryPin } from '../entities';

/** At most this many blocks are followed for one netlist. */
const MAX_PINS = 200;

/** The block versions `source` uses, nested uses included, in the order met. */
export async function pinsOf(m: EntityManager | DataSource, workspaceId: string, source: string): Promise<LibraryPin[]> {
  const pins = new Map<string, LibraryPin>();
  const queue = usesIn(source);
  for (let i = 0; i < queue.length && pins.size < MAX_PINS; i++) {
    const pin = queue[i];
    const key = `${pin.path}@${pin.version}`;
    if (pins.has(key)) continue;
    pins.set(key, pin);
    const [row]: { source: string }[] = await m.query(
      `SELECT v.source FROM block_versions v JOIN blocks b ON b.id = v.block_id WHERE b.workspace_id = $1 AND b.path = $2 AND v.version = $3`,
      [workspaceId, pin.path, pin.version],
    );
    if (row) queue.push(...usesIn(row.source));
  }
  return [...pins.values()];
}

/** The frozen sources of `pins` in the workspace (pins it lacks, or drafts, are left out). */
export async function pinnedSources(ds: DataSource, workspaceId: string, pins: LibraryPin[]): Promise<(LibraryPin & { source: string })[]> {
  if (pins.length === 0) return [];
  const rows: { path: string; version: number; source: string }[] = await ds.query(
    `SELECT b.path, v.version, v.source FROM block_versions v JOIN blocks b ON b.id = v.block_id
     JOIN jsonb_to_recordset($2::jsonb) AS p(path text, version int) ON p.path = b.path AND p.version = v.version
     WHERE b.workspace_id = $1 AND v.submitted_at IS NOT NULL`,
    [workspaceId, JSON.stringify(pins)],
  );
  const order = new Map(pins.map((p, i) => [`${p.path}@${p.version}`, i]));
  return rows.sort((a, b) => order.get(`${a.path}@${a.version}`)! - order.get(`${b.path}@${b.version}`)!);
}

/** The `use` lines of a source, as the solver's parser reads them (nothing is resolved). */
function usesIn(source: string): LibraryPin[] {
  const found: LibraryPin[] = [];
  parseNetlist(source, {
    resolveUse: (path, version) => {
      found.push({ path, version });
      return undefined;
    },
  });
  return found;
}
