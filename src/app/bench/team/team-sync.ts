/**
 * The bench's side of the team server: opening a team netlist (or one of its revisions) into a
 * draft, saving the draft back with the version it is based on, and resolving a conflict when
 * the team copy moved on meanwhile.
 *
 * The rule throughout: the text is written into the draft in this browser first, then sent.
 * A failed, refused or stale save leaves the text and its base version where they were, so the
 * user loses nothing and nothing on the server is overwritten without being shown.
 */
import { computed, DestroyRef, inject, Injectable, signal } from '@angular/core';
import { Drafts, titleOf, type DraftRemote } from '../../core/drafts';
import { roleAtLeast, Session } from '../../core/session';
import { apiErrorOf, staleCurrentOf, TeamApi, type NetlistSummary, type StaleCurrent } from '../../core/team-api';
import { BenchStore } from '../bench-store';
import { saveStatus, type SaveStatus, type TeamState } from './save-status';

/** How long to wait before trying an offline save again (besides the browser's `online` event). */
export const RETRY_MS = 20_000;
/** The label of the copy kept when the team's text is taken in a conflict. */
export const BEFORE_CONFLICT = 'my version before conflict';
/** The label of an edited merge kept when the team's text is taken anyway. */
export const UNFINISHED_MERGE = 'unfinished merge';

/** What a save to the team came to. */
export type PushOutcome =
  /** The draft is not linked to a team netlist. */
  | { kind: 'local' }
  | { kind: 'unchanged'; version: number }
  | { kind: 'saved'; version: number }
  | { kind: 'read-only' }
  | { kind: 'signed-out' }
  | { kind: 'conflict'; current: StaleCurrent }
  | { kind: 'offline' }
  | { kind: 'refused'; message: string };

/** What the user chose in the conflict view. */
export type ConflictChoice =
  | { action: 'keep-mine'; mine: string }
  | { action: 'save-merged'; merged: string }
  | { action: 'take-theirs'; mine: string; edited: string };

/** The answer to opening a team netlist: whether something was opened, and what to tell the user. */
export interface OpenOutcome {
  opened: boolean;
  message?: string;
  /** Signing in would help (the server answered 401). */
  signIn?: boolean;
}

@Injectable()
export class TeamSync {
  private readonly api = inject(TeamApi);
  private readonly session = inject(Session);
  private readonly drafts = inject(Drafts);
  private readonly store = inject(BenchStore);

  /** The last save's standing, for the netlist it was about. */
  private readonly last = signal<{ netlistId?: string; state: TeamState; conflict?: StaleCurrent; problem?: string }>({ state: 'idle' });
  private readonly mine = computed(() => {
    const last = this.last();
    return last.netlistId !== undefined && last.netlistId === this.store.remote()?.netlistId ? last : undefined;
  });
  /** Where the last save to the open netlist stands. */
  readonly state = computed<TeamState>(() => this.mine()?.state ?? 'idle');
  /** The team copy of the last 409, until the conflict is resolved. */
  readonly conflict = computed(() => this.mine()?.conflict);
  /** The server's sentence for the last refused save. */
  readonly problem = computed(() => this.mine()?.problem);

  /** Signed in with a role that may create netlists in the current workspace. */
  readonly canCreate = computed(() => !!this.session.me() && this.session.canWrite());
  /**
   * Whether the user may save to the linked netlist. Unknown (server not reached yet) counts as
   * yes: the server decides, and a refusal is reported.
   */
  readonly canWrite = computed(() => {
    const remote = this.store.remote();
    if (!remote) return false;
    const me = this.session.me();
    if (!me) return this.session.state() !== 'signed-out';
    return roleAtLeast(this.session.roleIn(remote.workspace), 'designer');
  });
  /** Signed out with a linked draft: saving needs a sign-in, which is not a matter of role. */
  private readonly signedOut = computed(() => this.session.state() === 'signed-out');

  /** The save-state line. */
  readonly status = computed<SaveStatus>(() => {
    const remote = this.store.remote();
    return saveStatus({
      local: this.store.saveState(),
      hasDraft: !!this.store.draftId(),
      team: remote && {
        baseVersion: remote.baseVersion,
        dirty: this.store.teamDirty(),
        canWrite: this.canWrite() || this.signedOut(),
        state: this.signedOut() && this.store.teamDirty() ? 'signed-out' : this.state(),
        conflictVersion: this.conflict()?.version,
      },
    });
  });

  private pushing: Promise<unknown> = Promise.resolve();
  /** The text a save failed to send for want of a server, sent again when it is back. */
  private pendingText: string | undefined;
  private retryTimer: ReturnType<typeof setTimeout> | undefined;

  constructor() {
    void this.session.load();
    const online = () => void this.retry();
    if (typeof window !== 'undefined') window.addEventListener('online', online);
    inject(DestroyRef).onDestroy(() => {
      if (typeof window !== 'undefined') window.removeEventListener('online', online);
      this.clearRetry();
    });
  }

  /**
   * Opens team netlist `id` into its linked draft: a new one the first time; the same one again
   * later — refreshed to the team's newest version when it has no changes of its own, kept as it
   * is when it does (saving will then show both texts). With `version`, opens that revision as
   * an unlinked copy labelled "revision N": the team netlist itself is never touched from it.
   */
  async open(id: string, version?: number): Promise<OpenOutcome> {
    await this.store.flushSave();
    this.reset();
    if (version !== undefined) return this.openRevision(id, version);
    const local = await this.drafts.linkedTo(id);
    let netlist;
    try {
      netlist = await this.api.getNetlist(id);
    } catch (err) {
      const e = apiErrorOf(err);
      if (local?.remote) {
        await this.showStored(local.id);
        const why = e.status === 0 ? 'The team server cannot be reached' : e.message.replace(/\.$/, '');
        return { opened: true, message: `${why}; this is your copy kept in this browser (team v${local.remote.baseVersion}).` };
      }
      return { opened: false, message: openProblem(e.status, e.message), signIn: e.status === 401 };
    }
    const fresh: DraftRemote = { netlistId: netlist.id, workspace: netlist.workspace, name: netlist.name, baseVersion: netlist.version, savedText: netlist.source };
    if (!local?.remote) {
      this.store.showDraft(await this.drafts.create(netlist.source, undefined, { remote: fresh }));
      return { opened: true };
    }
    if (local.text === local.remote.savedText) {
      const behind = local.remote.baseVersion !== netlist.version;
      await this.drafts.save(local.id, netlist.source, { remote: fresh, label: null });
      await this.showStored(local.id);
      return { opened: true, message: behind ? `Brought up to date with team v${netlist.version}.` : undefined };
    }
    await this.showStored(local.id);
    return netlist.version === local.remote.baseVersion
      ? { opened: true, message: `Your changes to “${netlist.name}” not yet saved to the team are still here (team v${netlist.version}).` }
      : { opened: true, message: `Your changes are based on team v${local.remote.baseVersion}; the team copy is now v${netlist.version}. Saving will show both side by side.` };
  }

  /** Links the open draft to a netlist just created from it with text `sent`. */
  async linkCreated(netlist: NetlistSummary, sent: string): Promise<void> {
    this.reset();
    await this.store.relink({ netlistId: netlist.id, workspace: netlist.workspace, name: netlist.name, baseVersion: netlist.version, savedText: sent });
  }

  /**
   * Saves the text to the linked netlist when it differs from the version it is based on.
   * Saves run one after another, each with the base version the previous one left.
   */
  push(text = this.store.source()): Promise<PushOutcome> {
    const next = this.pushing.then(() => this.send(text));
    this.pushing = next.catch(() => undefined);
    return next;
  }

  /**
   * Acts on the user's choice in the conflict view. Keeping mine or saving the merge rebases the
   * draft on the team's version (the user has now seen it) and saves; taking the team's first
   * keeps the user's text as a separate draft, then shows the team's.
   */
  async resolve(choice: ConflictChoice, current: StaleCurrent): Promise<PushOutcome> {
    const remote = this.store.remote();
    if (!remote) return { kind: 'local' };
    const rebased: DraftRemote = { ...remote, name: current.name, baseVersion: current.version, savedText: current.source };
    this.reset();
    switch (choice.action) {
      case 'keep-mine':
        await this.store.relink(rebased, choice.mine);
        return this.push(choice.mine);
      case 'save-merged':
        await this.store.relink(rebased, choice.merged);
        return this.push(choice.merged);
      case 'take-theirs': {
        await this.keepCopy(choice.mine, BEFORE_CONFLICT);
        if (choice.edited !== choice.mine) await this.keepCopy(choice.edited, UNFINISHED_MERGE);
        const id = this.store.draftId();
        if (id) await this.drafts.open(id); // keeping a copy made it the draft to reopen; this one is
        await this.store.relink(rebased, current.source);
        return { kind: 'unchanged', version: current.version };
      }
    }
  }

  private async send(text: string): Promise<PushOutcome> {
    const remote = this.store.remote();
    if (!remote) return { kind: 'local' };
    if (text === remote.savedText) {
      if (this.state() !== 'conflict') this.reset();
      return { kind: 'unchanged', version: remote.baseVersion };
    }
    if (this.session.state() === 'signed-out') {
      this.last.set({ netlistId: remote.netlistId, state: 'signed-out' });
      return { kind: 'signed-out' };
    }
    if (!this.canWrite()) return { kind: 'read-only' };
    this.last.set({ netlistId: remote.netlistId, state: 'saving' });
    this.clearRetry();
    try {
      const saved = await this.api.saveNetlist(remote.netlistId, { source: text, baseVersion: remote.baseVersion });
      const next: DraftRemote = { ...remote, name: saved.name, baseVersion: saved.version, savedText: text };
      this.pendingText = undefined;
      if (this.store.remote()?.netlistId === remote.netlistId) {
        this.reset();
        await this.store.relink(next);
      } else {
        // Another netlist was opened while this one was being saved: update its draft in place.
        const other = await this.drafts.linkedTo(remote.netlistId);
        if (other) await this.drafts.save(other.id, other.text, { remote: next });
      }
      return { kind: 'saved', version: saved.version };
    } catch (err) {
      return this.failed(err, text, remote.netlistId);
    }
  }

  private failed(err: unknown, text: string, netlistId: string): PushOutcome {
    const current = staleCurrentOf(err);
    const e = apiErrorOf(err);
    // Another netlist was opened while this save was under way: its standing is not this one's.
    if (this.store.remote()?.netlistId !== netlistId) {
      return current ? { kind: 'conflict', current } : e.status === 0 ? { kind: 'offline' } : { kind: 'refused', message: e.message };
    }
    if (current) {
      this.last.set({ netlistId, state: 'conflict', conflict: current });
      return { kind: 'conflict', current };
    }
    if (e.status === 0 || e.status === 502 || e.status === 503 || e.status === 504) {
      this.last.set({ netlistId, state: 'offline' });
      // Sent again when the server is back (while this netlist stays open).
      this.pendingText = text;
      this.retryTimer = setTimeout(() => void this.retry(), RETRY_MS);
      return { kind: 'offline' };
    }
    if (e.status === 401) {
      this.last.set({ netlistId, state: 'signed-out' });
      return { kind: 'signed-out' };
    }
    const state: TeamState = e.status === 403 ? 'forbidden' : e.status === 404 ? 'gone' : 'failed';
    this.last.set({ netlistId, state, problem: e.message });
    return { kind: 'refused', message: e.message };
  }

  /** Sends an offline save again; a conflict found then waits for the user's next Save. */
  private async retry(): Promise<void> {
    this.clearRetry();
    const text = this.pendingText;
    this.pendingText = undefined;
    if (text === undefined || this.state() !== 'offline') return;
    await this.push(text);
  }

  private async keepCopy(text: string, label: string): Promise<void> {
    const existing = await this.drafts.findCopy(text, label);
    if (!existing) await this.drafts.create(text, this.store.fileName(), { label });
  }

  private async showStored(id: string): Promise<void> {
    const draft = await this.drafts.open(id);
    if (draft) this.store.showDraft(draft);
  }

  private async openRevision(id: string, version: number): Promise<OpenOutcome> {
    const [netlist, revision] = await Promise.allSettled([this.api.getNetlist(id), this.api.revision(id, version)]);
    if (revision.status === 'rejected') {
      const e = apiErrorOf(revision.reason);
      return { opened: false, message: e.status === 404 ? `There is no revision ${version} of that netlist.` : openProblem(e.status, e.message) };
    }
    const text = revision.value.source;
    const name = netlist.status === 'fulfilled' ? netlist.value.name : titleOf(text);
    const label = `revision ${version}`;
    const existing = await this.drafts.findCopy(text, label);
    if (existing) await this.showStored(existing.id);
    else this.store.showDraft(await this.drafts.create(text, undefined, { label }));
    return { opened: true, message: `Revision ${version} of “${name}”, opened as a copy in this browser; the team netlist is unchanged.` };
  }

  private reset(): void {
    this.clearRetry();
    this.pendingText = undefined;
    this.last.set({ state: 'idle' });
  }

  private clearRetry(): void {
    if (this.retryTimer !== undefined) clearTimeout(this.retryTimer);
    this.retryTimer = undefined;
  }
}

/** Why a team netlist could not be opened, in a sentence. */
export function openProblem(status: number, message: string): string {
  switch (status) {
    case 0: return 'The team server cannot be reached, and this browser has no copy of that netlist.';
    case 401: return 'Sign in to open team netlists.';
    case 403: return 'Your role does not give access to that netlist.';
    case 404: return 'There is no team netlist at that address; it may have been deleted.';
    default: return message;
  }
}
