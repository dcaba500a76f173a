/**
 * A small in-memory block library for unit tests of the library pages: blocks with versions,
 * the states and rights of docs/api.md ("Block library"), and every write recorded. The real
 * server is tested in test/api and test/e2e.
 */
import { error } from '../../bench/team/testing/fake-team-api';
import type { Items, Person } from '../../core/team-api';
import type { BlockDetail, BlockState, BlockVersion, Catalogue, CatalogueQuery, CheckOutcome, DocumentedName, NewBlock, QueueItem, ReviewBody } from '../library-api';

export const ADA: Person = { id: 'u1', name: 'Ada Quill', email: 'ada@example.com' };
export const MEI: Person = { id: 'u2', name: 'Mei Tanaka', email: 'mei@example.com' };

interface StoredVersion {
  version: number;
  state: BlockState;
  source: string;
  author: Person;
  checks: CheckOutcome[] | null;
  submitted: boolean;
  reviews: BlockVersion['reviews'];
  pins: DocumentedName[];
  params: DocumentedName[];
}

export class FakeLibraryApi {
  /** Who calls: their id decides authorship rights. */
  me: Person = ADA;
  role: 'viewer' | 'designer' | 'reviewer' | 'admin' = 'reviewer';
  readonly blocks = new Map<string, { title: string; summary: string; tags: string[]; versions: StoredVersion[] }>();
  readonly submits: { path: string; version: number; checks: CheckOutcome[]; note?: string }[] = [];
  readonly reviewsSent: { path: string; version: number; body: ReviewBody }[] = [];
  /** The workspace of every read of a version, in order. */
  readonly slugsRead: string[] = [];
  private readonly at = '2026-03-12T10:00:00.000Z';

  /** A version as if written (and in `state`) on the server. */
  add(path: string, v: Partial<StoredVersion> & { source: string }, title = path): StoredVersion {
    const b = this.blocks.get(path) ?? { title, summary: '', tags: [], versions: [] };
    this.blocks.set(path, b);
    const stored: StoredVersion = {
      version: b.versions.length + 1, state: 'draft', author: MEI, checks: null, submitted: false, reviews: [], pins: [], params: [], ...v,
    };
    b.versions.push(stored);
    return stored;
  }

  async catalogue(_slug: string, _q: CatalogueQuery = {}): Promise<Catalogue> {
    const items = [...this.blocks.keys()].map((p) => this.summary(p));
    return { items, total: items.length };
  }

  async block(_slug: string, path: string): Promise<BlockDetail> {
    const b = this.find(path);
    return {
      ...this.summary(path),
      versionsList: [...b.versions].reverse().map((v) => ({
        version: v.version, state: v.state, author: v.author, createdAt: this.at, submittedAt: v.submitted ? this.at : null, decidedAt: null, decidedBy: null, retiredAt: null,
      })),
    };
  }

  async version(slug: string, path: string, version: number): Promise<BlockVersion> {
    this.slugsRead.push(slug);
    const b = this.find(path);
    const v = b.versions.find((x) => x.version === version);
    if (!v) throw error(404, 'version_not_found', `\`${path}\` has no version ${version}.`);
    const author = v.author.id === this.me.id;
    const at = (r: string) => ['viewer', 'designer', 'reviewer', 'admin'].indexOf(this.role) >= ['viewer', 'designer', 'reviewer', 'admin'].indexOf(r);
    return {
      path, title: b.title, version: v.version, state: v.state, source: v.source, pins: v.pins, params: v.params, checks: v.checks,
      author: v.author, createdAt: this.at, submittedAt: v.submitted ? this.at : null, decidedAt: null, decidedBy: null, retiredAt: null,
      reviews: v.reviews,
      can: {
        edit: author && v.state === 'draft' && !v.submitted && at('designer'),
        submit: author && v.state === 'draft' && at('designer'),
        review: !author && v.state === 'in_review' && at('reviewer'),
        retire: v.state === 'vetted' && at('admin'),
      },
    };
  }

  async submit(slug: string, path: string, version: number, body: { checks: CheckOutcome[]; note?: string }): Promise<BlockVersion & { mailed: string[] }> {
    const v = this.stored(path, version);
    if (v.state !== 'draft') throw error(409, 'illegal_transition', 'Only a draft can be submitted.');
    this.submits.push({ path, version, ...body });
    if (!v.submitted) v.checks = body.checks;
    v.submitted = true;
    v.state = 'in_review';
    v.reviews.push({ author: this.me, kind: 'submit', comment: body.note ?? '', line: null, createdAt: this.at });
    return { ...(await this.version(slug, path, version)), mailed: [MEI.email] };
  }

  async review(slug: string, path: string, version: number, body: ReviewBody): Promise<BlockVersion> {
    const v = this.stored(path, version);
    if (body.decision === 'send_back' && !body.comment && !body.comments?.length) throw error(400, 'reason_required', 'Say why it goes back.');
    this.reviewsSent.push({ path, version, body });
    for (const c of body.comments ?? []) v.reviews.push({ author: this.me, kind: 'comment', comment: c.text, line: c.line, createdAt: this.at });
    if (body.decision !== 'comment' || body.comment) v.reviews.push({ author: this.me, kind: body.decision, comment: body.comment ?? '', line: body.line ?? null, createdAt: this.at });
    if (body.decision === 'approve') v.state = 'vetted';
    if (body.decision === 'send_back') v.state = 'draft';
    return this.version(slug, path, version);
  }

  async reviewQueue(): Promise<Items<QueueItem>> {
    const items: QueueItem[] = [];
    for (const [path, b] of this.blocks) {
      for (const v of b.versions) {
        if (v.state === 'in_review' && v.author.id !== this.me.id) {
          items.push({ path, title: b.title, version: v.version, author: v.author, submittedAt: this.at, checks: { total: v.checks?.length ?? 0, failing: v.checks?.filter((c) => !c.pass).length ?? 0 } });
        }
      }
    }
    return { items };
  }

  async propose(slug: string, body: NewBlock): Promise<BlockVersion> {
    if (this.blocks.has(body.path)) throw error(409, 'block_exists', `\`${body.path}\` already exists.`);
    this.add(body.path, { source: body.source, author: this.me });
    return this.version(slug, body.path, 1);
  }

  async proposeVersion(slug: string, path: string, source: string): Promise<BlockVersion> {
    const v = this.add(path, { source, author: this.me });
    return this.version(slug, path, v.version);
  }

  async editDraft(slug: string, path: string, version: number, source: string): Promise<BlockVersion> {
    const v = this.stored(path, version);
    if (v.submitted) throw error(409, 'version_frozen', 'It was submitted: its source never changes.');
    v.source = source;
    return this.version(slug, path, version);
  }

  async retire(slug: string, path: string, version: number): Promise<BlockVersion> {
    this.stored(path, version).state = 'retired';
    return this.version(slug, path, version);
  }

  private summary(path: string): Catalogue['items'][number] {
    const b = this.find(path);
    const latest = b.versions[b.versions.length - 1];
    const vetted = [...b.versions].reverse().find((v) => v.state === 'vetted')?.version ?? null;
    return {
      id: path, path, category: path.split('/')[0], title: b.title, summary: b.summary, tags: b.tags,
      latest: { version: latest.version, state: latest.state }, vetted, versions: b.versions.length, updatedAt: this.at,
    };
  }

  private find(path: string) {
    const b = this.blocks.get(path);
    if (!b) throw error(404, 'block_not_found', `The library has no block \`${path}\`.`);
    return b;
  }

  private stored(path: string, version: number): StoredVersion {
    const v = this.find(path).versions.find((x) => x.version === version);
    if (!v) throw error(404, 'version_not_found', `\`${path}\` has no version ${version}.`);
    return v;
  }
}
