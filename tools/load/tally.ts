/**
 * What the virtual clients count during a phase, kept as plain data so it crosses from the
 * worker thread to the main thread as it is; and the arithmetic made of it afterwards.
 */

/** How a request ended: answered (`ok` includes 409 stale, a normal answer), or not. */
export type Outcome = 'ok' | 'unavailable' | 'server_error' | 'other' | 'timeout' | 'network' | 'aborted';
/** The netlist requests: the list of 50, one netlist with its text, a save (`PUT`). */
export const NETLIST_KINDS = ['list', 'one', 'save'] as const;
/** The block library's reads: the catalogue (no filter, a `q` search, a category, both), the
 *  block page, one version, and the bench resolving a `use` line (tools/load/library-reads.ts). */
export const LIBRARY_KINDS = ['catalogue', 'catalogueSearch', 'catalogueCategory', 'catalogueSearchCategory', 'block', 'version', 'use'] as const;
export const KINDS = [...NETLIST_KINDS, ...LIBRARY_KINDS] as const;
export type LibraryKind = (typeof LIBRARY_KINDS)[number];
export type Kind = (typeof KINDS)[number];

export interface Second {
  ok: number;
  stale: number;
  unavailable: number;
  other: number;
  timeout: number;
}

export interface Ack {
  id: string;
  version: number;
  /** SHA-256 (hex) of the UTF-8 text sent. */
  hash: string;
  /** When the answer arrived (epoch ms). */
  at: number;
}

export interface PhaseResult {
  name: string;
  startedAt: number;
  endedAt: number;
  requests: number;
  /** Latency in ms of every request that got an HTTP answer, by kind. */
  latency: Record<Kind, number[]>;
  /** Requests sent, by kind, answered or not. */
  sent: Record<Kind, number>;
  /** Requests that failed, by kind: no answer, a 5xx, any status but 2xx and 409, or a 2xx
   *  whose body was not what was asked for (`unexpected_answer`). */
  failed: Record<Kind, number>;
  /** By HTTP status, or `timeout` / `network` / `aborted` when none came. */
  statuses: Record<string, number>;
  /** Error codes of 5xx answers and network failures, with counts. */
  errors: Record<string, number>;
  timeline: Second[];
  /** The ten slowest requests: what they were and how they ended (`at`: seconds into the phase, sent). */
  slowest: { kind: Kind; status: number; code?: string; at: number; ms: number }[];
  /** Epoch ms of the first and last request that failed (no answer, 503, other 5xx). */
  firstFailureAt?: number;
  lastFailureAt?: number;
  acks: Ack[];
  /** Saves answered 503 or not at all: not acknowledged, though one may have committed. */
  unanswered: { id: string; hash: string }[];
  /** 409 answers to saves; of them, on the client's own netlist (which no one else saves). */
  stale: number;
  staleOwn: number;
  /** 409s whose server copy was this client's own save that had no answer. */
  ambiguous: number;
}

const byKind = <T>(make: () => T) => Object.fromEntries(KINDS.map((k) => [k, make()])) as Record<Kind, T>;

export function emptyPhase(name: string, startedAt: number): PhaseResult {
  return { name, startedAt, endedAt: startedAt, requests: 0, latency: byKind(() => []), sent: byKind(() => 0), failed: byKind(() => 0), statuses: {}, errors: {}, slowest: [], timeline: [], acks: [], unanswered: [], stale: 0, staleOwn: 0, ambiguous: 0 };
}

export function record(p: PhaseResult, kind: Kind, status: number, outcome: Outcome, ms: number, at: number, code?: string): void {
  p.requests++;
  const key = status ? String(status) : outcome;
  p.statuses[key] = (p.statuses[key] ?? 0) + 1;
  if (status) p.latency[kind].push(ms);
  p.sent[kind]++;
  if (outcome !== 'ok' && outcome !== 'aborted') p.failed[kind]++;
  if (p.slowest.length < 10 || ms > p.slowest[p.slowest.length - 1].ms) {
    p.slowest.push({ kind, status, ...(code ? { code } : {}), at: Math.round((at - ms - p.startedAt) / 100) / 10, ms: Math.round(ms) });
    p.slowest.sort((a, b) => b.ms - a.ms).splice(10);
  }
  const failed = outcome !== 'ok' && outcome !== 'other' && outcome !== 'aborted';
  if (failed) {
    const label = `${key} ${code ?? ''}`.trim();
    p.errors[label] = (p.errors[label] ?? 0) + 1;
    p.firstFailureAt ??= at;
    p.lastFailureAt = at;
  }
  const s = Math.max(0, Math.floor((at - p.startedAt) / 1000));
  while (p.timeline.length <= s) p.timeline.push({ ok: 0, stale: 0, unavailable: 0, other: 0, timeout: 0 });
  const bucket = p.timeline[s];
  if (status === 409) bucket.stale++;
  else if (outcome === 'ok') bucket.ok++;
  else if (outcome === 'unavailable') bucket.unavailable++;
  else if (outcome === 'timeout') bucket.timeout++;
  else bucket.other++;
}

/** Nearest-rank percentile of sorted values. */
function percentile(sorted: number[], p: number): number {
  if (!sorted.length) return NaN;
  return sorted[Math.min(sorted.length - 1, Math.max(0, Math.ceil((p / 100) * sorted.length) - 1))];
}

export interface LatencySummary {
  count: number;
  p50: number;
  p95: number;
  p99: number;
  max: number;
}

export function summarize(values: number[]): LatencySummary {
  const arr = [...values].sort((a, b) => a - b);
  const round = (v: number) => Math.round(v * 10) / 10;
  return { count: arr.length, p50: round(percentile(arr, 50)), p95: round(percentile(arr, 95)), p99: round(percentile(arr, 99)), max: round(arr.at(-1) ?? NaN) };
}
