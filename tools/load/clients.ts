/**
 * The virtual clients of `npm run load`, in a worker thread of their own: their bookkeeping never
 * queues behind the server's work on one event loop (they still share the cores with it).
 *
 * Each client is one designer's browser: its own session through the provider's form, its own
 * XSRF token, its own netlist and its own idea of every netlist's current version. A save sends
 * that version as `baseVersion`; a 409 hands back the server's copy, whose version becomes the new
 * base. A save answered 503, timed out or cut off is not acknowledged: the client keeps its base
 * and saves again later, and if that meets a 409 whose text is the one it sent, the lost answer
 * hid a save that had committed (counted as ambiguous: nothing was overwritten silently).
 */
import { createHash } from 'node:crypto';
import { performance } from 'node:perf_hooks';
import { parentPort, workerData } from 'node:worker_threads';
import { TeamClient } from '../../test/support/team-client';
import { DEMO_PASSWORD } from '../../api/services/seed';
import { dropAllConnections, dropIdleConnections, request } from './http';
import { libraryReads } from './library-reads';
import { netlistText } from './netlist-text';
import { emptyPhase, record, type Kind, type Outcome, type PhaseResult } from './tally';

export interface ClientsSetup {
  url: string;
  clients: number;
  /** Netlists every client also saves into, so stale saves (409) happen. */
  shared: number;
  timeoutMs: number;
}
export type ToClients = { type: 'run'; phase: string; seconds: number } | { type: 'stop' };
export type FromClients =
  | { type: 'ready'; signInMs: number; netlists: number; blocks: number }
  | { type: 'done'; result: PhaseResult }
  | { type: 'failed'; message: string };

const WORKSPACE = 'strainlab';
const ACCOUNTS = ['ravi@strainlab.example', 'ada@strainlab.example'];
/** Of the clients' requests, the block library's reads (enough of each kind for a p99). */
const LIBRARY_SHARE = 0.25;
/** Of the rest, the netlist reads; the others are saves. */
const READ_SHARE = 0.7;
const SHARED_SAVE_SHARE = 0.15;
const MAX_STALE_RETRIES = 5;
/** Pause after a failed request: short, so recovery is seen within a fraction of a second. */
const FAILURE_PAUSE_MS = 250;

const setup = workerData as ClientsSetup;
const library = libraryReads(WORKSPACE);
let stopping = false;

interface Known {
  base: number;
  /** Texts (by hash) whose save got no answer: any of them may have committed. */
  unanswered: Set<string>;
}

interface Answer {
  outcome: Outcome;
  status: number;
  body?: any;
}

const sha256 = (text: string) => createHash('sha256').update(text, 'utf8').digest('hex');

class VirtualClient {
  private sid = '';
  private xsrf = '';
  readonly known = new Map<string, Known>();
  own = '';
  private saves = 0;

  constructor(readonly index: number) {}

  async signIn(): Promise<void> {
    const browser = new TeamClient(setup.url);
    await browser.signIn(ACCOUNTS[this.index % ACCOUNTS.length], DEMO_PASSWORD);
    await browser.get('/api/me');
    this.sid = browser.cookie('nodewright.sid') ?? '';
    this.xsrf = browser.cookie('XSRF-TOKEN') ?? '';
    if (!this.sid || !this.xsrf) throw new Error(`client ${this.index}: no session or XSRF cookie after sign-in`);
  }

  /** One request with this client's cookies and a deadline; never throws. A 2xx whose body
   *  fails `expect` is counted as `other` (`unexpected_answer`). */
  async send(phase: PhaseResult | undefined, kind: Kind, method: string, path: string, json?: unknown, expect?: (body: any) => boolean): Promise<Answer> {
    const headers: Record<string, string> = { cookie: `nodewright.sid=${this.sid}; XSRF-TOKEN=${this.xsrf}` };
    if (method !== 'GET') headers['x-xsrf-token'] = decodeURIComponent(this.xsrf);
    if (json !== undefined) headers['content-type'] = 'application/json';
    const t0 = performance.now();
    let answer: Answer;
    try {
      const res = await request(`${setup.url}${path}`, { method, headers, body: json === undefined ? undefined : JSON.stringify(json), timeoutMs: setup.timeoutMs });
      for (const line of res.headers['set-cookie'] ?? []) {
        // The server renews the XSRF token when it finds the one sent invalid; keep what it sets.
        const [, name, value] = /^([^=]+)=([^;]*)/.exec(line) ?? [];
        if (name === 'XSRF-TOKEN' && value) this.xsrf = value;
        if (name === 'nodewright.sid' && value) this.sid = value;
      }
      const body = (res.headers['content-type'] ?? '').includes('json') && res.text ? JSON.parse(res.text) : undefined;
      const s = res.status;
      answer = { outcome: s === 503 ? 'unavailable' : s >= 500 ? 'server_error' : (s >= 200 && s < 300) || s === 409 ? 'ok' : 'other', status: s, body };
      if (expect && s >= 200 && s < 300 && !expect(body)) answer = { outcome: 'other', status: s, body: { error: { code: 'unexpected_answer' } } };
    } catch (err) {
      const e = err as Error & { code?: string };
      const outcome: Outcome = stopping ? 'aborted' : e.name === 'TimeoutError' ? 'timeout' : 'network';
      answer = { outcome, status: 0, body: { error: { code: e.code ?? e.name, message: e.message } } };
    }
    if (phase) record(phase, kind, answer.status, answer.outcome, performance.now() - t0, Date.now(), answer.body?.error?.code);
    return answer;
  }

  async createOwn(name: string): Promise<string> {
    const text = netlistText(this.index, 0, 'created');
    const r = await this.send(undefined, 'save', 'POST', `/api/workspaces/${WORKSPACE}/netlists`, { name, source: text });
    if (r.status !== 201) throw new Error(`client ${this.index}: creating "${name}" answered ${r.status} ${JSON.stringify(r.body?.error ?? '')}`);
    return r.body.id as string;
  }

  /** Saves new text into `id` until acknowledged, stale past retries, or failed; the last answer. */
  async save(phase: PhaseResult, id: string): Promise<Answer> {
    const state = this.known.get(id)!;
    let r: Answer = { outcome: 'ok', status: 0 };
    for (let attempt = 0; attempt <= MAX_STALE_RETRIES; attempt++) {
      const text = netlistText(this.index, ++this.saves, phase.name);
      const hash = sha256(text);
      r = await this.send(phase, 'save', 'PUT', `/api/netlists/${id}`, { source: text, baseVersion: state.base });
      if (r.status === 200) {
        state.base = r.body.version;
        state.unanswered.clear();
        phase.acks.push({ id, version: r.body.version, hash, at: Date.now() });
        return r;
      }
      if (r.status === 409 && r.body?.current) {
        phase.stale++;
        if (id === this.own) phase.staleOwn++;
        // Our own earlier save, whose answer was lost, is what made this base stale.
        if (state.unanswered.has(sha256(r.body.current.source))) phase.ambiguous++;
        state.base = r.body.current.version;
        state.unanswered.clear();
        continue;
      }
      if (r.outcome === 'unavailable' || r.outcome === 'timeout' || r.outcome === 'network') {
        state.unanswered.add(hash);
        phase.unanswered.push({ id, hash });
      }
      return r;
    }
    return r;
  }
}

function pick<T>(items: T[]): T {
  return items[Math.floor(Math.random() * items.length)];
}

/** The closed loop of one client for the phase: read or save, then again at once. */
async function loop(c: VirtualClient, phase: PhaseResult, until: number, ids: string[], shared: string[]): Promise<void> {
  // Designers do not all click in the same millisecond: the clients join over the first second.
  await new Promise((done) => setTimeout(done, Math.random() * 1000));
  while (Date.now() < until && !stopping) {
    let r: Answer;
    if (Math.random() < LIBRARY_SHARE) {
      const read = library.next();
      r = await c.send(phase, read.kind, 'GET', read.path, undefined, read.expect);
    } else if (Math.random() < READ_SHARE) {
      if (Math.random() < 0.4) r = await c.send(phase, 'list', 'GET', `/api/workspaces/${WORKSPACE}/netlists?pageSize=50`);
      else r = await c.send(phase, 'one', 'GET', `/api/netlists/${pick(ids)}`);
    } else {
      r = await c.save(phase, Math.random() < SHARED_SAVE_SHARE ? pick(shared) : c.own);
    }
    // A designer's browser would not hammer a server that just failed; it pauses briefly.
    if (r.outcome !== 'ok' && !stopping) await new Promise((done) => setTimeout(done, FAILURE_PAUSE_MS * (0.5 + Math.random())));
  }
}

/** Runs `fn` over `items` with at most `width` at a time. */
async function bounded<T>(items: T[], width: number, fn: (item: T) => Promise<void>): Promise<void> {
  let next = 0;
  await Promise.all(Array.from({ length: Math.min(width, items.length) }, async () => {
    while (next < items.length) await fn(items[next++]);
  }));
}

async function main(): Promise<void> {
  const clients = Array.from({ length: setup.clients }, (_, i) => new VirtualClient(i));
  const t0 = performance.now();
  // The provider's form and the callback are the heavy part; ten at a time keeps it moving.
  await bounded(clients, 10, (c) => c.signIn());
  const signInMs = performance.now() - t0;
  const shared: string[] = [];
  for (let s = 0; s < setup.shared; s++) shared.push(await clients[s % clients.length].createOwn(`Load shared ${s + 1}`));
  await bounded(clients, 10, async (c) => {
    c.own = await c.createOwn(`Load client ${c.index}`);
  });
  const ids = [...shared, ...clients.map((c) => c.own)];
  // The library reads need the seed blocks in the demo workspace of this database.
  const whole = library.whole();
  const listed = await clients[0].send(undefined, whole.kind, 'GET', whole.path);
  const missing = library.missing(listed.body);
  if (listed.status !== 200 || missing.length) throw new Error(`the catalogue of ${WORKSPACE} (${listed.status}) lacks seed blocks: ${missing.join(', ')}`);
  if (!whole.expect(listed.body)) throw new Error(`the catalogue of ${WORKSPACE} lists more than the ${library.blocks} seed blocks`);
  for (const c of clients) for (const id of [c.own, ...shared]) c.known.set(id, { base: 1, unanswered: new Set() });
  parentPort!.postMessage({ type: 'ready', signInMs, netlists: ids.length, blocks: library.blocks } satisfies FromClients);

  parentPort!.on('message', (m: ToClients) => {
    if (m.type === 'stop') {
      stopping = true;
      dropAllConnections();
    }
    if (m.type !== 'run') return;
    dropIdleConnections();
    const phase = emptyPhase(m.phase, Date.now());
    const until = phase.startedAt + m.seconds * 1000;
    void Promise.all(clients.map((c) => loop(c, phase, until, ids, shared))).then(() => {
      phase.endedAt = Date.now();
      parentPort!.postMessage({ type: 'done', result: phase } satisfies FromClients);
    });
  });
}

main().catch((err) => parentPort!.postMessage({ type: 'failed', message: (err as Error).message } satisfies FromClients));
