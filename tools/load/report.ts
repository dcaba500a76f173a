/**
 * The figures of a phase, as printed and as written to `test-results/load.json`.
 */
import { availableParallelism } from 'node:os';
import { KINDS, LIBRARY_KINDS, summarize, type Kind, type LatencySummary, type PhaseResult, type Second } from './tally';
import type { CpuFigures } from './cpu';
import type { ServerSample } from './server';
import type { Verification } from './verify';

export interface Outage {
  /** Seconds from the phase start: stop asked, database seen down, start asked, seen up. */
  stopAskedAt: number;
  downAt: number | null;
  startAskedAt: number | null;
  upAt: number | null;
  /** First and last failed request (503, other 5xx, timeout, network), from the phase start. */
  clientsFirstFailure: number | null;
  clientsLastFailure: number | null;
  /** From the database seen up to the first acknowledged save that followed, in seconds. */
  recovery: number | null;
}

/** The figures of one kind of request (or a group of kinds): `count` requests sent, answered or
 *  not, `perSecond` of them over the phase, the latencies of those answered, and the failures. */
export interface KindFigures extends LatencySummary {
  perSecond: number;
  errors: number;
}

/** The rows of the latency table: a kind, or a group of them, with its label (indent: nesting). */
const GROUPS = {
  all: KINDS,
  reads: ['list', 'one'],
  saves: ['save'],
  library: LIBRARY_KINDS,
  catalogueAll: ['catalogue', 'catalogueSearch', 'catalogueCategory', 'catalogueSearchCategory'],
} as const satisfies Record<string, readonly Kind[]>;
type Row = keyof typeof GROUPS | Kind;
const ROWS: [Row, string][] = [
  ['all', 'all'], ['reads', 'netlist reads'], ['list', '  list of 50'], ['one', '  one netlist'], ['saves', 'saves'],
  ['library', 'library reads'], ['catalogueAll', '  catalogue'], ['catalogue', '    no filter'], ['catalogueSearch', '    q'],
  ['catalogueCategory', '    category'], ['catalogueSearchCategory', '    q + category'], ['block', '  block page'],
  ['version', '  one version'], ['use', '  use (bench)'],
];
/** The library rows of the summary at the end, with their labels there. */
const LIBRARY_ROWS: [Row, string][] = [
  ['catalogueAll', 'catalogue, all forms'], ['catalogue', 'catalogue, no filter'], ['catalogueSearch', 'catalogue ?q='],
  ['catalogueCategory', 'catalogue ?category='], ['catalogueSearchCategory', 'catalogue ?q=&category='], ['block', 'block page'],
  ['version', 'one version'], ['use', 'use (bench)'],
];

export interface PhaseFigures {
  name: string;
  /** When the phase began (ISO), to line the timeline up with the server's and PostgreSQL's logs. */
  startedAt: string;
  seconds: number;
  requests: number;
  perSecond: number;
  /** Saves answered 200 in this phase. */
  acknowledged: number;
  /** By kind of request and by group (`all`, `reads`: netlist reads, `saves`, `library`, `catalogueAll`). */
  latencyMs: Record<Row, KindFigures>;
  statuses: Record<string, number>;
  errors: Record<string, number>;
  slowest: PhaseResult['slowest'];
  stale: number;
  staleOwn: number;
  ambiguous: number;
  timeouts: number;
  timeline?: Second[];
  outage?: Outage;
  cpu: CpuFigures;
  verification: Verification;
  server: { heapMb: { start: number; max: number; end: number }; rssMbMax: number; pools: ServerSample['pools']; loopDelayMs: { p50: number; p99: number; max: number }; loadAverage: number[]; crashed: string[] };
}

export function figuresOf(p: PhaseResult, verification: Verification, server: PhaseFigures['server'], cpu: CpuFigures, outage?: Outage): PhaseFigures {
  const seconds = (p.endedAt - p.startedAt) / 1000;
  return {
    name: p.name,
    startedAt: new Date(p.startedAt).toISOString(),
    seconds: round(seconds),
    requests: p.requests,
    perSecond: round(p.requests / seconds),
    acknowledged: p.acks.length,
    latencyMs: Object.fromEntries(ROWS.map(([row]) => [row, kindFigures(p, row in GROUPS ? GROUPS[row as keyof typeof GROUPS] : [row as Kind], seconds)])) as Record<Row, KindFigures>,
    statuses: p.statuses,
    errors: p.errors,
    slowest: p.slowest,
    stale: p.stale,
    staleOwn: p.staleOwn,
    ambiguous: p.ambiguous,
    timeouts: p.statuses.timeout ?? 0,
    ...(outage ? { timeline: p.timeline, outage } : {}),
    cpu,
    verification,
    server,
  };
}

function kindFigures(p: PhaseResult, kinds: readonly Kind[], seconds: number): KindFigures {
  const sum = (by: Record<Kind, number>) => kinds.reduce((n, k) => n + by[k], 0);
  const latency = summarize(kinds.flatMap((k) => p.latency[k]));
  return { ...latency, count: sum(p.sent), perSecond: round(sum(p.sent) / seconds), errors: sum(p.failed) };
}

const round = (v: number) => Math.round(v * 10) / 10;
const pad = (s: string | number, n: number) => String(s).padStart(n);

export function printPhase(f: PhaseFigures): void {
  console.log(`\n${f.name}: ${f.requests} requests in ${f.seconds} s = ${f.perSecond} requests/s`);
  console.log(`  ${'requests'.padEnd(18)}   count   req/s  p50 ms  p95 ms  p99 ms  max ms  errors`);
  for (const [row, label] of ROWS) console.log(`  ${label.padEnd(18)}${kindLine(f.latencyMs[row])}`);
  console.log(`  statuses: ${Object.entries(f.statuses).sort().map(([k, n]) => `${k} ×${n}`).join(', ')}`);
  console.log(`  409 stale: ${f.stale} (on the client's own netlist: ${f.staleOwn}; ambiguous: ${f.ambiguous}), timeouts: ${f.timeouts}`);
  const errors = Object.entries(f.errors);
  console.log(`  errors (no answer, 5xx): ${errors.length ? errors.map(([k, n]) => `${k} ×${n}`).join(', ') : 'none'}`);
  const s = f.server;
  const slow = f.slowest.slice(0, 3).map((r) => `${r.kind} ${r.status || 'no answer'}${r.code ? ` ${r.code}` : ''} sent at ${r.at} s: ${r.ms} ms`);
  console.log(`  slowest: ${slow.join('; ')}`);
  const c = f.cpu;
  console.log(`  CPU (cores busy of ${availableParallelism()}): machine ${c.machineCores}, this process ${c.nodeProcessCores} (server loop ${Math.round(c.serverLoop * 100)} % busy, clients loop ${Math.round(c.clientsLoop * 100)} %), PostgreSQL ${c.postgresCores ?? 'n/a (restarted)'}`);
  for (const [name, p] of Object.entries(s.pools)) console.log(`  ${name}: ${p.acquired} connections handed out, at most ${p.waitingMax} requests waiting, longest wait ${p.waitMsMax} ms, ${p.waitsOver1s} waits over 1 s`);
  console.log(`  server: heap after full GC ${s.heapMb.start} → ${s.heapMb.end} MB (${s.heapMb.max} MB at most during the phase), process RSS max ${s.rssMbMax} MB, event-loop delay p99 ${s.loopDelayMs.p99} ms (max ${s.loopDelayMs.max}), load average ${s.loadAverage.join(' → ')}${s.crashed.length ? `, CRASHED: ${s.crashed.join('; ')}` : ''}`);
}

const kindLine = (s: KindFigures) => [s.count, s.perSecond, s.p50, s.p95, s.p99, s.max, s.errors].map((v) => pad(v, 8)).join('');

export function printOutage(f: PhaseFigures): void {
  const o = f.outage!;
  const t = (v: number | null) => (v === null ? '—' : `${v.toFixed(1)} s`);
  console.log(`  PostgreSQL: stop asked at ${t(o.stopAskedAt)}, down at ${t(o.downAt)}, start asked at ${t(o.startAskedAt)}, up at ${t(o.upAt)}`);
  console.log(`  clients saw failures from ${t(o.clientsFirstFailure)} to ${t(o.clientsLastFailure)}; first acknowledged save ${t(o.recovery)} after the database was up`);
  console.log('  second      ok   409   503 other timeout');
  f.timeline!.forEach((b, i) => console.log(`  ${pad(i, 6)}${pad(b.ok, 8)}${pad(b.stale, 6)}${pad(b.unavailable, 6)}${pad(b.other, 6)}${pad(b.timeout, 8)}`));
}

/** One line per phase: the compact table at the end. */
export function printSummary(phases: PhaseFigures[]): void {
  const head = ['phase', 'req/s', 'p50 ms', 'p95 ms', 'p99 ms', 'max ms', 'acked', '409', 'ambig.', '503', 'other 5xx', 'no answer', 'missing', 'mismatch'];
  const rows = phases.map((f) => {
    const l = f.latencyMs.all;
    const count = (pred: (k: string) => boolean) => Object.entries(f.statuses).filter(([k]) => pred(k)).reduce((n, [, v]) => n + v, 0);
    return [f.name, f.perSecond, l.p50, l.p95, l.p99, l.max, f.acknowledged, f.stale, f.ambiguous,
      count((k) => k === '503'), count((k) => /^5\d\d$/.test(k) && k !== '503'), count((k) => !/^\d+$/.test(k)), f.verification.missing, f.verification.mismatched].map(String);
  });
  const widths = head.map((h, i) => Math.max(h.length, ...rows.map((r) => r[i].length)));
  const line = (cells: string[]) => cells.map((c, i) => (i === 0 ? c.padEnd(widths[i]) : c.padStart(widths[i]))).join('  ');
  console.log(`\n${line(head)}`);
  for (const r of rows) console.log(line(r));
  const width = Math.max(...LIBRARY_ROWS.map(([, label]) => label.length)) + Math.max(...phases.map((f) => f.name.length)) + 2;
  console.log(`\n${'library reads, phase'.padEnd(width)}   count   req/s  p50 ms  p95 ms  p99 ms  max ms  errors`);
  for (const [row, label] of LIBRARY_ROWS) for (const f of phases) console.log(`${`${label}, ${f.name}`.padEnd(width)}${kindLine(f.latencyMs[row])}`);
}
