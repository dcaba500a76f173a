/**
 * How the library writes states, badges and review entries: one table per vocabulary, so the
 * catalogue, the block page and the queue say the same thing the same way.
 */
import type { BlockState, BlockSummary, ReviewKind } from './library-api';

/** The chip of a version's state; the symbol keeps the meaning when colour is not seen. */
export const STATE_CHIP: Record<BlockState, { label: string; symbol: string; meaning: string }> = {
  draft: { label: 'Draft', symbol: '✎', meaning: 'being written by its author; not yet for use' },
  in_review: { label: 'In review', symbol: '◔', meaning: 'submitted; waiting for a reviewer' },
  vetted: { label: 'Vetted', symbol: '✓', meaning: 'reviewed and approved for use' },
  retired: { label: 'Retired', symbol: '⊘', meaning: 'no longer recommended; netlists pinning it still solve' },
};

/** The state filter of the catalogue, in workflow order. */
export const STATE_FILTERS: readonly { state: BlockState; label: string }[] = [
  { state: 'vetted', label: 'Vetted' },
  { state: 'in_review', label: 'In review' },
  { state: 'draft', label: 'Draft' },
  { state: 'retired', label: 'Retired' },
];

/** "Vetted", "In review", … */
export function stateLabel(state: BlockState): string {
  return STATE_CHIP[state]?.label ?? state;
}

/** "v3 · Vetted", for a version chip. */
export function versionChip(version: number, state: BlockState): string {
  return `v${version} · ${stateLabel(state)}`;
}

/** The catalogue's badge: "vetted v3", or undefined when no version is vetted yet. */
export function vettedBadge(block: Pick<BlockSummary, 'vetted'>): string | undefined {
  return block.vetted ? `vetted v${block.vetted}` : undefined;
}

/**
 * What the newest version is when it is newer than the vetted one (or when nothing is vetted):
 * "v4 in review", "v2 draft", "v1 retired"; undefined when the newest is the vetted one.
 */
export function latestNote(block: Pick<BlockSummary, 'vetted' | 'latest'>): string | undefined {
  const { version, state } = block.latest;
  if (block.vetted !== null && version <= block.vetted) return undefined;
  return `v${version} ${stateLabel(state).toLowerCase()}`;
}

/** How a review entry reads in the thread. */
export const REVIEW_KIND_WORDS: Record<ReviewKind, string> = {
  submit: 'submitted it for review',
  comment: 'commented',
  approve: 'approved it: vetted',
  send_back: 'sent it back to draft',
};

export function reviewKindWords(kind: string): string {
  return REVIEW_KIND_WORDS[kind as ReviewKind] ?? kind;
}

/** "3 checks, 1 failing", "1 check, all pass", "no checks". */
export function checksSummary(total: number, failing: number): string {
  if (total === 0) return 'no checks';
  const n = `${total} check${total === 1 ? '' : 's'}`;
  return failing === 0 ? `${n}, all pass` : `${n}, ${failing} failing`;
}
