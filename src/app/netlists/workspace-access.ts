/**
 * Which workspace a team page shows, and what to say instead when it cannot show one. Pure, so
 * the pages only render the answer.
 */
import { computed, inject, type Signal } from '@angular/core';
import { Session, type SessionState } from '../core/session';
import type { Me, WorkspaceRef } from '../core/team-api';

export type WorkspaceAccess =
  | { kind: 'loading' }
  | { kind: 'offline' }
  | { kind: 'signed-out' }
  | { kind: 'no-workspace' }
  | { kind: 'not-member'; slug: string }
  | { kind: 'member'; workspace: WorkspaceRef };

/**
 * The page's workspace: the one named in the address (`/w/:slug/…`) when the user is a member of
 * it, else the session's current one when the address names none.
 */
export function workspaceAccess(state: SessionState, me: Me | null | undefined, slug: string | undefined, current: WorkspaceRef | undefined): WorkspaceAccess {
  if (state === 'offline') return { kind: 'offline' };
  if (me === undefined || state === 'unknown') return { kind: 'loading' };
  if (!me) return { kind: 'signed-out' };
  if (slug) {
    const named = me.workspaces.find((w) => w.slug === slug);
    return named ? { kind: 'member', workspace: named } : { kind: 'not-member', slug };
  }
  const ws = current ?? me.workspaces[0];
  return ws ? { kind: 'member', workspace: ws } : { kind: 'no-workspace' };
}

/**
 * A team page's access and workspace as signals, for the page addressed by `slug` (or by none).
 * Call it where `inject()` works (a field initializer).
 */
export function pageWorkspace(slug: () => string | undefined): { access: Signal<WorkspaceAccess>; workspace: Signal<WorkspaceRef | undefined> } {
  const session = inject(Session);
  const access = computed(() => workspaceAccess(session.state(), session.me(), slug(), session.workspace()));
  const workspace = computed(() => {
    const a = access();
    return a.kind === 'member' ? a.workspace : undefined;
  });
  return { access, workspace };
}
