/**
 * The share dialog's logic, apart from its view: when a link expires, which addresses to notify,
 * which library versions the shared text pins, and how a link's openings read.
 */
import type { LibraryPin, ShareLink } from '../../core/team-api';
import { timeAgo } from '../time-ago';

export type ExpiryChoice = 'never' | '1d' | '7d' | '30d' | 'date';

export const EXPIRY_CHOICES: readonly { value: ExpiryChoice; label: string }[] = [
  { value: 'never', label: 'Never' },
  { value: '1d', label: 'In 1 day' },
  { value: '7d', label: 'In 7 days' },
  { value: '30d', label: 'In 30 days' },
  { value: 'date', label: 'On a date…' },
];

const DAY_MS = 86_400_000;
const DAYS: Partial<Record<ExpiryChoice, number>> = { '1d': 1, '7d': 7, '30d': 30 };

/**
 * When a new link expires, as the ISO time the server takes (`expiresAt` left out: never).
 * A date (`YYYY-MM-DD`, as a date input gives it) means the end of that day in the user's time
 * zone, so "expires on the 12th" still works all of the 12th.
 */
export function expiryOf(choice: ExpiryChoice, date: string, now: Date): { expiresAt?: string; error?: string } {
  if (choice === 'never') return {};
  const days = DAYS[choice];
  if (days !== undefined) return { expiresAt: new Date(now.getTime() + days * DAY_MS).toISOString() };
  const m = /^(\d{4})-(\d{2})-(\d{2})$/.exec(date.trim());
  if (!m) return { error: 'Choose the day the link should stop working.' };
  const end = new Date(Number(m[1]), Number(m[2]) - 1, Number(m[3]), 23, 59, 59, 999);
  if (end.getMonth() !== Number(m[2]) - 1 || end.getDate() !== Number(m[3])) return { error: 'That is not a calendar date.' };
  if (end.getTime() <= now.getTime()) return { error: 'That day has passed; choose today or a later day.' };
  return { expiresAt: end.toISOString() };
}

/** A plain e-mail address check: something@domain.tld, no spaces (the server checks again). */
export function isEmail(address: string): boolean {
  return /^[^\s@,;<>()]+@[^\s@,;<>()]+\.[^\s@,;<>()]{2,}$/.test(address);
}

/** Splits typed or pasted addresses (commas, semicolons, spaces, new lines); duplicates once. */
export function parseEmails(text: string): { valid: string[]; invalid: string[] } {
  const valid: string[] = [];
  const invalid: string[] = [];
  const seen = new Set<string>();
  for (const raw of text.split(/[\s,;]+/)) {
    const address = raw.trim().replace(/^<|>$/g, '');
    if (!address || seen.has(address.toLowerCase())) continue;
    seen.add(address.toLowerCase());
    (isEmail(address) ? valid : invalid).push(address);
  }
  return { valid, invalid };
}

/** "not opened yet", "opened once, 5 min ago", "opened 3 times, last 5 min ago". */
export function openedText(link: Pick<ShareLink, 'openCount' | 'lastOpenedAt'>, now = Date.now()): string {
  if (link.openCount === 0 || !link.lastOpenedAt) return 'not opened yet';
  const ago = timeAgo(Date.parse(link.lastOpenedAt), now);
  return link.openCount === 1 ? `opened once, ${ago}` : `opened ${link.openCount} times, last ${ago}`;
}

/** "expires 12 Mar", "expired 12 Mar", "never expires". */
export function expiresText(link: Pick<ShareLink, 'expiresAt' | 'state' | 'revokedAt'>, now = Date.now()): string {
  if (link.state === 'revoked') return link.revokedAt ? `revoked ${shortDate(link.revokedAt)}` : 'revoked';
  if (!link.expiresAt) return 'never expires';
  return `${Date.parse(link.expiresAt) <= now ? 'expired' : 'expires'} ${shortDate(link.expiresAt)}`;
}

/** A date as "12 Mar 2026, 14:05" in the user's locale. */
export function shortDate(iso: string): string {
  const d = new Date(iso);
  return Number.isNaN(d.getTime()) ? iso : d.toLocaleString(undefined, { day: 'numeric', month: 'short', year: 'numeric', hour: '2-digit', minute: '2-digit' });
}
