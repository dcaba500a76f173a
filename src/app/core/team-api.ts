/**
 * The team server's API as typed calls (see docs/api.md). Thin on purpose: components and stores
 * decide what to do with answers; errors arrive as HttpErrorResponse whose `error` is the
 * server's one shape, read with `apiErrorOf`.
 */
import { HttpClient, HttpErrorResponse, HttpParams } from '@angular/common/http';
import { inject, Injectable } from '@angular/core';
import { firstValueFrom } from 'rxjs';

export type Role = 'viewer' | 'designer' | 'reviewer' | 'admin';
export type Visibility = 'private' | 'workspace';

export interface Person { id: string; name: string; email: string }
export interface WorkspaceRef { slug: string; name: string; role: Role }
export interface Me { user: Person; workspaces: WorkspaceRef[] }

export interface NetlistSummary {
  id: string;
  workspace: string;
  name: string;
  visibility: Visibility;
  version: number;
  size: number;
  owner: Person;
  updatedBy: Person;
  createdAt: string;
  updatedAt: string;
  deletedAt: string | null;
  canWrite: boolean;
  canDelete: boolean;
}
export interface Netlist extends NetlistSummary { source: string }

export interface NetlistQuery {
  q?: string;
  sort?: 'name' | 'updatedAt' | 'size' | 'owner';
  order?: 'asc' | 'desc';
  page?: number;
  pageSize?: number;
  deleted?: boolean;
}

export interface RevisionSummary { version: number; author: Person; createdAt: string; size: number }
export interface Revision extends RevisionSummary { source: string }

/** The server copy sent with a 409 `stale`. */
export interface StaleCurrent { version: number; source: string; name: string; updatedAt: string; author: Person }

export interface LibraryPin { path: string; version: number }
export interface CreatedShare { id: string; url: string; version: number; expiresAt: string | null; createdAt: string; notified: string[] }
export interface ShareLink {
  id: string;
  version: number;
  createdAt: string;
  expiresAt: string | null;
  revokedAt: string | null;
  state: 'active' | 'expired' | 'revoked';
  openCount: number;
  lastOpenedAt: string | null;
  createdBy: Person;
}
export interface SharedNetlist {
  name: string;
  source: string;
  version: number;
  workspace: { name: string };
  author: { name: string };
  revisionCreatedAt: string;
  sharedBy: { name: string };
  sharedAt: string;
  expiresAt: string | null;
  /** The library versions the revision uses (nested uses included), read by the server. */
  libraryPins: LibraryPin[];
  /** The sources of those the workspace holds frozen: the reader resolves `use` lines from them. */
  library: (LibraryPin & { source: string })[];
}

export interface Member { userId: string; name: string; email: string; role: Role; joinedAt: string }
export interface Invitation { id: string; email: string; role: Role; createdAt: string; expiresAt: string; invitedBy: Person; mailed?: boolean }
export interface InvitationPreview { workspace: { slug: string; name: string }; email: string; role: Role; invitedBy: { name: string }; expiresAt: string }
export interface AuditEntry { id: string; at: string; actor: Person | null; action: string; targetType: string; targetId: string | null; details: Record<string, unknown> | null }

export interface Page<T> { items: T[]; total: number }
export interface Items<T> { items: T[] }

/** The server's error shape. */
export interface ApiError { code: string; message: string; details?: unknown }

/** The server's `{ error }` from a failed call, or a plain one for network failures. */
export function apiErrorOf(err: unknown): ApiError & { status: number } {
  if (err instanceof HttpErrorResponse) {
    const body = err.error as { error?: ApiError } | null;
    if (body && typeof body === 'object' && body.error?.code) return { ...body.error, status: err.status };
    if (err.status === 0) return { code: 'offline', message: 'The team server cannot be reached; your work is kept in this browser.', status: 0 };
    return { code: 'http_error', message: `The server answered ${err.status} ${err.statusText}.`, status: err.status };
  }
  return { code: 'unknown', message: err instanceof Error ? err.message : String(err), status: 0 };
}

/** The `current` server copy of a 409 stale answer, if that is what `err` is. */
export function staleCurrentOf(err: unknown): StaleCurrent | undefined {
  if (err instanceof HttpErrorResponse && err.status === 409) {
    const body = err.error as { error?: ApiError; current?: StaleCurrent } | null;
    if (body?.error?.code === 'stale' && body.current) return body.current;
  }
  return undefined;
}

@Injectable({ providedIn: 'root' })
export class TeamApi {
  private readonly http = inject(HttpClient);

  me(): Promise<Me> {
    return firstValueFrom(this.http.get<Me>('/api/me'));
  }
  settings(): Promise<{ devInboxUrl: string | null }> {
    return firstValueFrom(this.http.get<{ devInboxUrl: string | null }>('/api/settings'));
  }
  signOut(): Promise<void> {
    return firstValueFrom(this.http.post<void>('/auth/sign-out', {}));
  }

  // Netlists
  listNetlists(slug: string, query: NetlistQuery = {}): Promise<Page<NetlistSummary>> {
    let params = new HttpParams();
    for (const [k, v] of Object.entries(query)) if (v !== undefined && v !== '') params = params.set(k, String(v));
    return firstValueFrom(this.http.get<Page<NetlistSummary>>(`/api/workspaces/${enc(slug)}/netlists`, { params }));
  }
  createNetlist(slug: string, body: { name: string; source: string; visibility?: Visibility }): Promise<Netlist> {
    return firstValueFrom(this.http.post<Netlist>(`/api/workspaces/${enc(slug)}/netlists`, body));
  }
  uploadNetlists(slug: string, files: File[]): Promise<Items<NetlistSummary>> {
    const form = new FormData();
    for (const f of files) form.append('files', f, f.name);
    return firstValueFrom(this.http.post<Items<NetlistSummary>>(`/api/workspaces/${enc(slug)}/netlists/upload`, form));
  }
  getNetlist(id: string): Promise<Netlist> {
    return firstValueFrom(this.http.get<Netlist>(`/api/netlists/${enc(id)}`));
  }
  /** Rejects with a 409 carrying `current` (read it with `staleCurrentOf`) when `baseVersion` is stale. */
  saveNetlist(id: string, body: { source: string; baseVersion: number; name?: string }): Promise<NetlistSummary> {
    return firstValueFrom(this.http.put<NetlistSummary>(`/api/netlists/${enc(id)}`, body));
  }
  updateNetlist(id: string, body: { name?: string; visibility?: Visibility }): Promise<NetlistSummary> {
    return firstValueFrom(this.http.patch<NetlistSummary>(`/api/netlists/${enc(id)}`, body));
  }
  deleteNetlist(id: string): Promise<void> {
    return firstValueFrom(this.http.delete<void>(`/api/netlists/${enc(id)}`));
  }
  restoreNetlist(id: string): Promise<NetlistSummary> {
    return firstValueFrom(this.http.post<NetlistSummary>(`/api/netlists/${enc(id)}/restore`, {}));
  }
  revisions(id: string): Promise<Items<RevisionSummary>> {
    return firstValueFrom(this.http.get<Items<RevisionSummary>>(`/api/netlists/${enc(id)}/revisions`));
  }
  revision(id: string, version: number): Promise<Revision> {
    return firstValueFrom(this.http.get<Revision>(`/api/netlists/${enc(id)}/revisions/${version}`));
  }
  /** Where the browser downloads a revision as a `.nwl` file. */
  revisionFileUrl(id: string, version: number): string {
    return `/api/netlists/${enc(id)}/revisions/${version}/file`;
  }
  restoreRevision(id: string, version: number, baseVersion: number): Promise<NetlistSummary> {
    return firstValueFrom(this.http.post<NetlistSummary>(`/api/netlists/${enc(id)}/revisions/${version}/restore`, { baseVersion }));
  }

  // Shares
  createShare(id: string, body: { expiresAt?: string; notify?: string[] }): Promise<CreatedShare> {
    return firstValueFrom(this.http.post<CreatedShare>(`/api/netlists/${enc(id)}/shares`, body));
  }
  shares(id: string): Promise<Items<ShareLink>> {
    return firstValueFrom(this.http.get<Items<ShareLink>>(`/api/netlists/${enc(id)}/shares`));
  }
  revokeShare(shareId: string): Promise<void> {
    return firstValueFrom(this.http.delete<void>(`/api/shares/${enc(shareId)}`));
  }
  shared(token: string): Promise<SharedNetlist> {
    return firstValueFrom(this.http.get<SharedNetlist>(`/api/shared/${enc(token)}`));
  }

  // Members, invitations, audit
  members(slug: string): Promise<Items<Member>> {
    return firstValueFrom(this.http.get<Items<Member>>(`/api/workspaces/${enc(slug)}/members`));
  }
  changeRole(slug: string, userId: string, role: Role): Promise<Member> {
    return firstValueFrom(this.http.patch<Member>(`/api/workspaces/${enc(slug)}/members/${enc(userId)}`, { role }));
  }
  removeMember(slug: string, userId: string): Promise<void> {
    return firstValueFrom(this.http.delete<void>(`/api/workspaces/${enc(slug)}/members/${enc(userId)}`));
  }
  invitations(slug: string): Promise<Items<Invitation>> {
    return firstValueFrom(this.http.get<Items<Invitation>>(`/api/workspaces/${enc(slug)}/invitations`));
  }
  invite(slug: string, body: { email: string; role: Role }): Promise<Invitation> {
    return firstValueFrom(this.http.post<Invitation>(`/api/workspaces/${enc(slug)}/invitations`, body));
  }
  revokeInvitation(id: string): Promise<void> {
    return firstValueFrom(this.http.delete<void>(`/api/invitations/${enc(id)}`));
  }
  invitation(token: string): Promise<InvitationPreview> {
    return firstValueFrom(this.http.get<InvitationPreview>(`/api/invitations/${enc(token)}`));
  }
  audit(slug: string, page = 0, pageSize = 50): Promise<Page<AuditEntry>> {
    const params = new HttpParams().set('page', page).set('pageSize', pageSize);
    return firstValueFrom(this.http.get<Page<AuditEntry>>(`/api/workspaces/${enc(slug)}/audit`, { params }));
  }
}

function enc(part: string): string {
  return encodeURIComponent(part);
}
