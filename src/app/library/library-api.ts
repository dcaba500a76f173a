/**
 * The team block library's routes as typed calls (docs/api.md, "Block library"). Thin, like
 * TeamApi: pages decide what to do with answers; errors arrive as HttpErrorResponse, read with
 * `apiErrorOf` from core/team-api.
 */
import { HttpClient, HttpParams } from '@angular/common/http';
import { inject, Injectable } from '@angular/core';
import { firstValueFrom } from 'rxjs';
import type { Items, Person } from '../core/team-api';

/** draft → in_review → vetted → retired; in_review → draft when sent back. */
export const BLOCK_STATES = ['draft', 'in_review', 'vetted', 'retired'] as const;
export type BlockState = (typeof BLOCK_STATES)[number];

/** One row of the catalogue. */
export interface BlockSummary {
  id: string;
  /** `category/name`. */
  path: string;
  category: string;
  title: string;
  summary: string;
  tags: string[];
  /** The newest version, whatever its state. */
  latest: { version: number; state: BlockState };
  /** The newest vetted version (what a netlist should pin), or null. */
  vetted: number | null;
  /** How many versions the block has. */
  versions: number;
  updatedAt: string;
}

export interface VersionSummary {
  version: number;
  state: BlockState;
  author: Person;
  createdAt: string;
  submittedAt: string | null;
  decidedAt: string | null;
  decidedBy: Person | null;
  retiredAt: string | null;
}

/** A block with every version, newest first. */
export interface BlockDetail extends BlockSummary {
  versionsList: VersionSummary[];
}

/** A pin or param of a version with its doc line (docs/netlist.md, block doc comments). */
export interface DocumentedName {
  name: string;
  doc: string | null;
  /** A param's default, as written on its `param` line. */
  default?: string | null;
}

/** A check of the version's own fixture as solved in a browser. */
export interface CheckOutcome {
  line: number;
  text: string;
  pass: boolean;
  /** The checked value; null when it was not a finite number. */
  value?: number | null;
}

export type ReviewKind = 'submit' | 'comment' | 'approve' | 'send_back';

export interface ReviewEntry {
  id?: string;
  author: Person;
  kind: ReviewKind | string;
  comment: string;
  line: number | null;
  createdAt: string;
}

/** What the caller may do with a version now (the server refuses the rest anyway). */
export interface VersionRights {
  edit: boolean;
  submit: boolean;
  review: boolean;
  retire: boolean;
}

/** One version with its source, docs, the author's checks and the review thread. */
export interface BlockVersion extends VersionSummary {
  path: string;
  title: string;
  source: string;
  pins: DocumentedName[];
  params: DocumentedName[];
  /** The checks solved in the author's browser at the first submission; null before. */
  checks: CheckOutcome[] | null;
  reviews: ReviewEntry[];
  can: VersionRights;
}

export interface QueueItem {
  path: string;
  title: string;
  version: number;
  author: Person;
  submittedAt: string;
  checks: { total: number; failing: number };
}

export interface CatalogueQuery {
  q?: string;
  category?: string;
  state?: BlockState;
  tag?: string;
}

export interface Catalogue {
  items: BlockSummary[];
  total: number;
}

export interface NewBlock {
  path: string;
  source: string;
  title?: string;
  summary?: string;
  tags?: string[];
}

export type ReviewDecision = 'approve' | 'send_back' | 'comment';

export interface ReviewBody {
  decision: ReviewDecision;
  comment?: string;
  line?: number;
  comments?: { line: number; text: string }[];
}

/**
 * The catalogue's query string: only the filters that are set, the search trimmed, in a fixed
 * order (so equal queries are equal URLs and the browser's cache can match them).
 */
export function catalogueParams(query: CatalogueQuery): HttpParams {
  let params = new HttpParams();
  const q = query.q?.trim();
  if (q) params = params.set('q', q);
  if (query.category) params = params.set('category', query.category);
  if (query.state) params = params.set('state', query.state);
  const tag = query.tag?.trim();
  if (tag) params = params.set('tag', tag);
  return params;
}

@Injectable({ providedIn: 'root' })
export class LibraryApi {
  private readonly http = inject(HttpClient);

  catalogue(slug: string, query: CatalogueQuery = {}): Promise<Catalogue> {
    return firstValueFrom(this.http.get<Catalogue>(`/api/workspaces/${enc(slug)}/blocks`, { params: catalogueParams(query) }));
  }
  /** 201 with version 1, a draft; 409 `block_exists`; 400 `block_not_defined`. */
  propose(slug: string, body: NewBlock): Promise<BlockVersion> {
    return firstValueFrom(this.http.post<BlockVersion>(`/api/workspaces/${enc(slug)}/blocks`, body));
  }
  block(slug: string, path: string): Promise<BlockDetail> {
    return firstValueFrom(this.http.get<BlockDetail>(blockUrl(slug, path)));
  }
  version(slug: string, path: string, version: number): Promise<BlockVersion> {
    return firstValueFrom(this.http.get<BlockVersion>(`${blockUrl(slug, path)}/versions/${version}`));
  }
  /** The next version, a draft of the caller's. */
  proposeVersion(slug: string, path: string, source: string): Promise<BlockVersion> {
    return firstValueFrom(this.http.post<BlockVersion>(`${blockUrl(slug, path)}/versions`, { source }));
  }
  /** Its author, before the first submission; 409 `version_frozen` after. */
  editDraft(slug: string, path: string, version: number, source: string): Promise<BlockVersion> {
    return firstValueFrom(this.http.put<BlockVersion>(`${blockUrl(slug, path)}/versions/${version}`, { source }));
  }
  submit(slug: string, path: string, version: number, body: { checks: CheckOutcome[]; note?: string }): Promise<BlockVersion & { mailed?: string[] }> {
    return firstValueFrom(this.http.post<BlockVersion & { mailed?: string[] }>(`${blockUrl(slug, path)}/versions/${version}/submit`, body));
  }
  /** `send_back` without a reason answers 400 `reason_required`. */
  review(slug: string, path: string, version: number, body: ReviewBody): Promise<BlockVersion> {
    return firstValueFrom(this.http.post<BlockVersion>(`${blockUrl(slug, path)}/versions/${version}/review`, body));
  }
  retire(slug: string, path: string, version: number): Promise<BlockVersion> {
    return firstValueFrom(this.http.post<BlockVersion>(`${blockUrl(slug, path)}/versions/${version}/retire`, {}));
  }
  /** Versions in review that the caller did not write, oldest first (reviewers). */
  reviewQueue(slug: string): Promise<Items<QueueItem>> {
    return firstValueFrom(this.http.get<Items<QueueItem>>(`/api/workspaces/${enc(slug)}/review-queue`));
  }
}

/** `/api/workspaces/SLUG/blocks/CATEGORY/NAME`, each part encoded on its own. */
function blockUrl(slug: string, path: string): string {
  return `/api/workspaces/${enc(slug)}/blocks/${path.split('/').map(enc).join('/')}`;
}

function enc(part: string): string {
  return encodeURIComponent(part);
}
