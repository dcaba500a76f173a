/**
 * A small in-memory team server for unit tests of the bench's team logic: netlists with
 * versions and revisions, 409 `stale` on an old base version, and an off switch that makes every
 * call fail like an unreachable server. The real server is tested in test/api and test/e2e.
 */
import { HttpErrorResponse } from '@angular/common/http';
import type { Items, Me, Netlist, NetlistSummary, Revision, Role, SharedNetlist, StaleCurrent, Visibility } from '../../../core/team-api';

const MEI = { id: 'u2', name: 'Mei Tanaka', email: 'mei@example.com' };
const ME = { id: 'u1', name: 'Ada Quill', email: 'ada@example.com' };

export class FakeTeamApi {
  /** False: every call fails as if the server could not be reached (status 0). */
  online = true;
  role: Role = 'designer';
  /** False: `me` answers 401 and so do saves. */
  signedIn = true;
  readonly netlists = new Map<string, Netlist>();
  readonly revisionsOf = new Map<string, Revision[]>();
  /** Every PUT as sent. */
  readonly puts: { id: string; source: string; baseVersion: number }[] = [];
  private nextId = 1;
  private clock = Date.parse('2026-03-12T10:00:00Z');

  async me(): Promise<Me> {
    this.check();
    if (!this.signedIn) throw error(401, 'signed_out', 'Sign in first.');
    return { user: ME, workspaces: [{ slug: 'strainlab', name: 'Strainlab', role: this.role }] };
  }

  /** A netlist as if created on the server, by `by`. */
  seed(name: string, source: string, by = MEI): Netlist {
    const id = `n${this.nextId++}`;
    const at = this.tick();
    const n: Netlist = { id, workspace: 'strainlab', name, visibility: 'workspace', version: 1, size: source.length, owner: by, updatedBy: by, createdAt: at, updatedAt: at, deletedAt: null, canWrite: true, canDelete: true, source };
    this.netlists.set(id, n);
    this.revisionsOf.set(id, [{ version: 1, author: by, createdAt: at, size: source.length, source }]);
    return n;
  }

  /** Someone else saves a new version. */
  saveAs(id: string, source: string, by = MEI): Netlist {
    const n = this.netlists.get(id)!;
    const at = this.tick();
    const next: Netlist = { ...n, source, version: n.version + 1, updatedAt: at, updatedBy: by, size: source.length };
    this.netlists.set(id, next);
    this.revisionsOf.get(id)!.push({ version: next.version, author: by, createdAt: at, size: source.length, source });
    return next;
  }

  async getNetlist(id: string): Promise<Netlist> {
    this.check();
    const n = this.netlists.get(id);
    if (!n) throw error(404, 'not_found', 'There is no such netlist.');
    return { ...n };
  }

  async createNetlist(_slug: string, body: { name: string; source: string; visibility?: Visibility }): Promise<Netlist> {
    this.check();
    const n = this.seed(body.name, body.source, ME);
    return { ...n, visibility: body.visibility ?? 'workspace' };
  }

  async saveNetlist(id: string, body: { source: string; baseVersion: number }): Promise<NetlistSummary> {
    this.check();
    const n = this.netlists.get(id);
    if (!n) throw error(404, 'not_found', 'There is no such netlist.');
    if (!this.signedIn) throw error(401, 'signed_out', 'Sign in first.');
    if (this.role === 'viewer') throw error(403, 'forbidden', 'Your role does not allow this.');
    if (body.baseVersion !== n.version) {
      const current: StaleCurrent = { version: n.version, source: n.source, name: n.name, updatedAt: n.updatedAt, author: n.updatedBy };
      throw new HttpErrorResponse({ status: 409, error: { error: { code: 'stale', message: 'The netlist changed since your version.' }, current } });
    }
    this.puts.push({ id, ...body });
    const { source: _s, ...summary } = this.saveAs(id, body.source, ME);
    return summary;
  }

  async revision(id: string, version: number): Promise<Revision> {
    this.check();
    const r = this.revisionsOf.get(id)?.find((x) => x.version === version);
    if (!r) throw error(404, 'not_found', 'There is no such revision.');
    return { ...r };
  }

  async shares(): Promise<Items<never>> {
    this.check();
    return { items: [] };
  }

  /** What `shared(token)` answers: a shared netlist, or an error to throw. */
  sharedAnswer: SharedNetlist | HttpErrorResponse = error(404, 'share_not_found', 'There is no shared netlist at this address.');

  async shared(_token: string): Promise<SharedNetlist> {
    this.check();
    if (this.sharedAnswer instanceof HttpErrorResponse) throw this.sharedAnswer;
    return structuredClone(this.sharedAnswer);
  }

  private check(): void {
    if (!this.online) throw new HttpErrorResponse({ status: 0, statusText: 'Unknown Error' });
  }

  private tick(): string {
    this.clock += 60_000;
    return new Date(this.clock).toISOString();
  }
}

export function error(status: number, code: string, message: string): HttpErrorResponse {
  return new HttpErrorResponse({ status, error: { error: { code, message } } });
}
