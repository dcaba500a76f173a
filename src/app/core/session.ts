/**
 * Who is signed in, in which workspaces and with which role, as signals; the workspace the user
 * is working in; sign-in and sign-out. The server decides every permission: the role here only
 * hides what the server would refuse anyway.
 */
import { computed, inject, Injectable, signal } from '@angular/core';
import type { CanActivateFn } from '@angular/router';
import { apiErrorOf, TeamApi, type Me, type Role, type WorkspaceRef } from './team-api';

const ROLE_ORDER: readonly Role[] = ['viewer', 'designer', 'reviewer', 'admin'];
const WORKSPACE_KEY = 'nodewright.workspace';

/** Whether `role` grants at least what `needed` grants (viewer < designer < reviewer < admin). */
export function roleAtLeast(role: Role | undefined, needed: Role): boolean {
  return !!role && ROLE_ORDER.indexOf(role) >= ROLE_ORDER.indexOf(needed);
}

/** The server route that starts sign-in and comes back to `next` (a path of this app). */
export function signInUrl(next: string, invite?: string): string {
  // "//host" and "/\host" are read by browsers as another site: only plain paths come back here.
  const params = new URLSearchParams({ next: /^\/(?![/\\])/.test(next) ? next : '/' });
  if (invite) params.set('invite', invite);
  return `/auth/sign-in?${params}`;
}

export type SessionState = 'unknown' | 'signed-in' | 'signed-out' | 'offline';

@Injectable({ providedIn: 'root' })
export class Session {
  private readonly api = inject(TeamApi);
  private loading: Promise<Me | null> | undefined;

  /** The signed-in user and their workspaces; null when signed out; undefined before the first answer. */
  readonly me = signal<Me | null | undefined>(undefined);
  readonly state = signal<SessionState>('unknown');
  private readonly chosenSlug = signal<string | null>(readChosen());

  /** The workspace being worked in: the one chosen last, else the first. */
  readonly workspace = computed<WorkspaceRef | undefined>(() => {
    const all = this.me()?.workspaces ?? [];
    return all.find((w) => w.slug === this.chosenSlug()) ?? all[0];
  });
  readonly role = computed<Role | undefined>(() => this.workspace()?.role);
  /**
   * The workspace whose library the bench resolves `use` lines from: the one worked in; before the
   * server has answered, or while it cannot be reached, the one worked in last in this browser
   * (its blocks then come from this browser's copies). Signed out: none.
   */
  readonly librarySlug = computed<string | undefined>(() => {
    if (this.state() === 'signed-out') return undefined;
    return this.workspace()?.slug ?? (this.me() ? undefined : this.chosenSlug() ?? undefined);
  });
  readonly canWrite = computed(() => roleAtLeast(this.role(), 'designer'));
  readonly isAdmin = computed(() => roleAtLeast(this.role(), 'admin'));

  /** Asks the server who is signed in (once; `force` asks again). */
  load(force = false): Promise<Me | null> {
    if (this.loading && !force) return this.loading;
    this.loading = this.api.me().then(
      (me) => {
        this.me.set(me);
        this.state.set('signed-in');
        // Remembered so that the next visit resolves library blocks before (or without) the server's answer.
        const slug = this.workspace()?.slug;
        if (slug && slug !== this.chosenSlug()) this.chooseWorkspace(slug);
        return me;
      },
      (err) => {
        const e = apiErrorOf(err);
        if (e.status === 401) {
          this.me.set(null);
          this.state.set('signed-out');
          return null;
        }
        // Offline or the server is down: the bench still works; team features say so.
        this.state.set('offline');
        if (this.me() === undefined) this.me.set(null);
        this.loading = undefined;
        return null;
      },
    );
    return this.loading;
  }

  /** Works in `slug` from now on (remembered in this browser). */
  chooseWorkspace(slug: string): void {
    this.chosenSlug.set(slug);
    try {
      localStorage.setItem(WORKSPACE_KEY, slug);
    } catch {
      /* storage unavailable: the choice lasts for this page */
    }
  }

  /** The user's role in `slug`, if a member. */
  roleIn(slug: string): Role | undefined {
    return this.me()?.workspaces.find((w) => w.slug === slug)?.role;
  }

  /** Leaves the app for the provider's sign-in page; comes back to `next`. */
  signIn(next = currentPath()): void {
    window.location.assign(signInUrl(next));
  }

  async signOut(): Promise<void> {
    try {
      await this.api.signOut();
    } finally {
      this.me.set(null);
      this.state.set('signed-out');
      this.loading = Promise.resolve(null);
    }
  }
}

/** Route guard: pages that need a session send a signed-out user to sign-in and back. */
export const requireSignIn: CanActivateFn = async (_route, state) => {
  const session = inject(Session);
  const me = await session.load();
  if (me) return true;
  if (session.state() === 'offline') return true; // the page itself says the server cannot be reached
  session.signIn(state.url);
  return false;
};

function currentPath(): string {
  return typeof location === 'undefined' ? '/' : `${location.pathname}${location.search}`;
}

function readChosen(): string | null {
  try {
    return localStorage.getItem(WORKSPACE_KEY);
  } catch {
    return null;
  }
}
