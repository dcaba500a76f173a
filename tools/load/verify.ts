/**
 * After a phase: is every acknowledged save in `netlist_revisions`, with the very text sent?
 * And is every netlist's history whole (versions 1..current, no gap)? Read straight from the
 * tables, not through the API, so the answer does not depend on the code under load.
 */
import type { Ack } from './tally';

export interface Verification {
  acknowledged: number;
  present: number;
  missing: number;
  mismatched: number;
  netlists: number;
  /** Netlists whose revisions are not exactly 1..current version. */
  gapped: number;
  /** Netlists whose current version is below a version acknowledged for them. */
  behind: number;
  /** Saves answered 503 or not at all, that committed nonetheless (their text is a revision). */
  unansweredCommitted: number;
  /** A few of the problems, to start looking from. */
  examples: string[];
}

/** Runs one statement and returns its rows (a pg client's query, unwrapped). */
export type Query = (sql: string, params?: unknown[]) => Promise<any[]>;

export async function verifyAcks(query: Query, acks: Ack[], unanswered: { id: string; hash: string }[] = []): Promise<Verification> {
  const ids = [...new Set([...acks, ...unanswered].map((a) => a.id))];
  const rows: { id: string; version: number; hash: string }[] = ids.length
    ? await query(
        `SELECT netlist_id AS id, version, encode(sha256(convert_to(source, 'UTF8')), 'hex') AS hash
         FROM netlist_revisions WHERE netlist_id = ANY($1::uuid[])`,
        [ids],
      )
    : [];
  const stored = new Map(rows.map((r) => [`${r.id}@${r.version}`, r.hash]));
  const texts = new Set(rows.map((r) => `${r.id}:${r.hash}`));
  // Every save's text is unique (it carries a counter), so finding it means that save committed.
  const unansweredCommitted = unanswered.filter((u) => texts.has(`${u.id}:${u.hash}`)).length;
  const v: Verification = { acknowledged: acks.length, present: 0, missing: 0, mismatched: 0, netlists: 0, gapped: 0, behind: 0, unansweredCommitted, examples: [] };
  const highest = new Map<string, number>();
  for (const a of acks) {
    highest.set(a.id, Math.max(highest.get(a.id) ?? 0, a.version));
    const hash = stored.get(`${a.id}@${a.version}`);
    if (hash === undefined) {
      v.missing++;
      if (v.examples.length < 5) v.examples.push(`missing: ${a.id} version ${a.version}`);
    } else if (hash !== a.hash) {
      v.mismatched++;
      if (v.examples.length < 5) v.examples.push(`other text: ${a.id} version ${a.version}`);
    } else v.present++;
  }
  const histories: { id: string; version: number; revisions: number; first: number | null; last: number | null }[] = await query(
    `SELECT n.id, n.version, count(r.version)::int AS revisions, min(r.version) AS first, max(r.version) AS last
     FROM netlists n LEFT JOIN netlist_revisions r ON r.netlist_id = n.id GROUP BY n.id, n.version`,
  );
  v.netlists = histories.length;
  for (const h of histories) {
    // The primary key (netlist_id, version) makes versions unique: count, first and last settle it.
    if (h.revisions !== h.version || h.first !== 1 || h.last !== h.version) {
      v.gapped++;
      if (v.examples.length < 5) v.examples.push(`history of ${h.id}: ${h.revisions} revisions, ${h.first}..${h.last}, current ${h.version}`);
    }
    if ((highest.get(h.id) ?? 0) > h.version) v.behind++;
  }
  return v;
}

export function verificationLine(v: Verification): string {
  return `acknowledged saves: ${v.acknowledged}, present as revisions: ${v.present}, missing: ${v.missing}, mismatched: ${v.mismatched}; ` +
    `histories gapless 1..version: ${v.netlists - v.gapped} of ${v.netlists}${v.behind ? `, ${v.behind} behind an acknowledged version` : ''}; ` +
    `saves answered 503 or not at all that committed anyway: ${v.unansweredCommitted}`;
}

export const verified = (v: Verification) => v.missing === 0 && v.mismatched === 0 && v.behind === 0;
