/**
 * The shared view's sentences: the line under its title, and why a link shows nothing.
 */
import type { SharedNetlist } from '../core/team-api';

/** The label of a draft made from a shared netlist ("Core (shared copy)"). */
export const SHARED_COPY = 'shared copy';

function day(iso: string): string {
  const d = new Date(iso);
  return Number.isNaN(d.getTime()) ? iso : d.toLocaleDateString(undefined, { day: 'numeric', month: 'short', year: 'numeric' });
}

/** "v3 · from Strainlab · shared by Mei Tanaka on 12 Mar 2026 · expires 19 Mar 2026". */
export function sharedMeta(s: Pick<SharedNetlist, 'version' | 'workspace' | 'sharedBy' | 'sharedAt' | 'expiresAt' | 'author' | 'revisionCreatedAt'>): string {
  const parts = [
    `v${s.version}`,
    `from ${s.workspace.name}`,
    `shared by ${s.sharedBy.name} on ${day(s.sharedAt)}`,
    s.expiresAt ? `expires ${day(s.expiresAt)}` : 'does not expire',
  ];
  if (s.author.name !== s.sharedBy.name || day(s.revisionCreatedAt) !== day(s.sharedAt)) parts.push(`this version saved by ${s.author.name} on ${day(s.revisionCreatedAt)}`);
  return parts.join(' · ');
}

/** Why a share link shows nothing, in one sentence. */
export function shareProblem(code: string, status: number): string {
  switch (code) {
    case 'share_expired': return 'This link has expired.';
    case 'share_revoked': return 'This link was revoked by its author.';
    case 'share_not_found': return 'There is no shared netlist at this address.';
  }
  if (status === 0 || status === 502 || status === 503 || status === 504) return 'The Nodewright server cannot be reached, so the shared netlist cannot be shown. Try again when you are back online.';
  if (status === 404) return 'There is no shared netlist at this address.';
  if (status === 429) return 'This link was opened too often in a short time; wait a minute and try again.';
  return 'The shared netlist could not be loaded; the server had a problem. Try again in a moment.';
}
