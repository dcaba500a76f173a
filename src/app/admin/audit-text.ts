/**
 * The audit log's entries as short text for a table row. The server records actions as dotted
 * codes (`member.role_change`) with free-form details; these turn them into a few readable words
 * without knowing every action in advance.
 */
import type { AuditEntry } from '../core/team-api';
import { absoluteTime } from '../netlists/format';

const MAX_DETAILS = 120;
/** Detail fields that name the target; shown as the target, not again among the details. */
const NAMING_KEYS = ['name', 'email', 'file', 'title'];
const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;
const ISO_TIME = /^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}/;

/** "member.role_change" → "Member role change". */
export function actionLabel(action: string): string {
  const words = action.replace(/[._-]+/g, ' ').trim();
  return words ? words.charAt(0).toUpperCase() + words.slice(1) : action;
}

/** What the entry is about: the name, address or file in its details, else the kind and a short id. */
export function targetText(entry: Pick<AuditEntry, 'targetType' | 'targetId' | 'details'>): string {
  const kind = entry.targetType.replace(/_/g, ' ');
  const d = entry.details ?? {};
  for (const key of NAMING_KEYS) {
    const v = d[key];
    if (typeof v === 'string' && v) return `${kind} “${v}”`;
  }
  return entry.targetId ? `${kind} ${entry.targetId.slice(0, 8)}` : kind;
}

/** The details in one short line: "designer → admin", "version: 4; renamed from: Old name". */
export function detailsText(details: Record<string, unknown> | null): string {
  if (!details) return '';
  const parts: string[] = [];
  const { from, to, ...rest } = details;
  const both = from !== undefined && to !== undefined;
  if (both) parts.push(`${short(from)} → ${short(to)}`);
  const fields = both ? rest : details;
  for (const [k, v] of Object.entries(fields)) {
    if (v === undefined || v === null || NAMING_KEYS.includes(k) || (Array.isArray(v) && v.length === 0)) continue;
    parts.push(`${words(k)}: ${short(v)}`);
  }
  const text = parts.join('; ');
  return text.length > MAX_DETAILS ? `${text.slice(0, MAX_DETAILS - 1)}…` : text;
}

/** "renamedFrom" and "base_version" → "renamed from", "base version". */
function words(key: string): string {
  return key.replace(/_/g, ' ').replace(/([a-z])([A-Z])/g, '$1 $2').toLowerCase();
}

function short(v: unknown): string {
  if (v === undefined || v === null) return '–';
  if (Array.isArray(v)) return v.map(short).join(', ');
  if (typeof v === 'object') {
    const entries = Object.entries(v as Record<string, unknown>).filter(([, x]) => x !== undefined && x !== null);
    return entries.length === 1 ? short(entries[0][1]) : entries.map(([k, x]) => `${words(k)} ${short(x)}`).join(', ');
  }
  if (typeof v === 'string' && UUID.test(v)) return v.slice(0, 8);
  if (typeof v === 'string' && ISO_TIME.test(v)) return absoluteTime(v) || v;
  return String(v);
}
