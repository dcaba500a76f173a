/**
 * A block's versions, newest first, each with its state, author and dates; tick any two to see
 * their sources side by side (the netlists pages' diff view). Sources are fetched as needed and
 * kept: a submitted version never changes.
 */
import { ChangeDetectionStrategy, Component, computed, effect, inject, input, signal, untracked } from '@angular/core';
import { RouterLink } from '@angular/router';
import { MatButtonModule } from '@angular/material/button';
import { MatCheckboxModule } from '@angular/material/checkbox';
import { apiErrorOf } from '../core/team-api';
import { DiffView } from '../netlists/diff-view';
import { AgoPipe, ExactTimePipe } from '../netlists/format-pipes';
import { comparePair, previousVersion, toggleCompare } from '../netlists/revision-choice';
import { LibraryApi, type VersionSummary } from './library-api';
import { blockLink } from './library-links';
import { StateChip } from './state-chip';

@Component({
  selector: 'nw-block-versions',
  imports: [RouterLink, MatButtonModule, MatCheckboxModule, DiffView, AgoPipe, ExactTimePipe, StateChip],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <p class="hint">Tick two versions to compare their sources.
      @if (previous(); as p) { <button mat-button type="button" (click)="chosen.set([p, shown()])">Compare v{{ shown() }} with v{{ p }}</button> }
    </p>
    <table class="list" aria-label="Versions, newest first">
      <thead><tr><th scope="col">Compare</th><th scope="col">Version</th><th scope="col">Author</th><th scope="col">Written</th><th scope="col">Decided</th></tr></thead>
      <tbody>
        @for (v of versions(); track v.version) {
          <tr [class.shown]="v.version === shown()">
            <td><mat-checkbox [checked]="chosen().includes(v.version)" (change)="tick(v.version)" [aria-label]="'Compare version ' + v.version" /></td>
            <td>
              <a [routerLink]="link(v.version)" [attr.aria-current]="v.version === shown() ? 'page' : null"><nw-state-chip [state]="v.state" [version]="v.version" /></a>
            </td>
            <td>{{ v.author.name }}</td>
            <td><span [title]="v.createdAt | exactTime">{{ v.createdAt | ago }}</span></td>
            <td>
              @if (v.decidedAt) { <span [title]="v.decidedAt | exactTime">{{ v.decidedAt | ago }}</span>@if (v.decidedBy) { by {{ v.decidedBy.name }} } }
              @else if (v.submittedAt) { submitted <span [title]="v.submittedAt | exactTime">{{ v.submittedAt | ago }}</span> }
              @else { — }
            </td>
          </tr>
        }
      </tbody>
    </table>
    @if (pair(); as p) {
      <h3>v{{ p.older }} → v{{ p.newer }}</h3>
      @if (problem(); as e) { <p class="problem" role="alert">{{ e }}</p> }
      @if (texts().get(p.older) !== undefined && texts().get(p.newer) !== undefined) {
        <nw-diff-view [left]="texts().get(p.older)!" [right]="texts().get(p.newer)!" [leftLabel]="'Version ' + p.older" [rightLabel]="'Version ' + p.newer" />
      } @else if (!problem()) {
        <p class="hint">Fetching both sources…</p>
      }
    }
  `,
  styles: `
    :host { display: block; font-size: 0.875rem; }
    .hint { margin: 0 0 6px; color: var(--mat-sys-on-surface-variant); }
    .list { width: 100%; border-collapse: collapse; margin-bottom: 12px; }
    th { text-align: left; font-size: 0.75rem; text-transform: uppercase; letter-spacing: 0.04em; color: var(--mat-sys-on-surface-variant);
      border-bottom: 1px solid var(--mat-sys-outline-variant); padding: 4px 6px; }
    td { padding: 2px 6px; border-bottom: 1px solid var(--mat-sys-outline-variant); }
    tr.shown { background: var(--mat-sys-surface-container); }
    th:first-child, td:first-child { width: 1%; }
    a { text-decoration: none; }
    h3 { font: var(--mat-sys-title-small); margin: 8px 0 6px; }
    .problem { padding: 6px 10px; border-left: 3px solid #b3261e; background: #fbeae8; color: #5c1410; }
  `,
})
export class BlockVersions {
  private readonly api = inject(LibraryApi);

  readonly slug = input.required<string>();
  readonly path = input.required<string>();
  readonly base = input.required<string>();
  /** Every version, newest first. */
  readonly versions = input.required<readonly VersionSummary[]>();
  /** The version on the page, and its source (no need to fetch it again). */
  readonly shown = input.required<number>();
  readonly shownSource = input.required<string>();

  protected readonly chosen = signal<number[]>([]);
  protected readonly pair = computed(() => comparePair(this.chosen()));
  protected readonly previous = computed(() => previousVersion(this.versions().map((v) => v.version), this.shown()));
  protected readonly texts = signal<ReadonlyMap<number, string>>(new Map());
  protected readonly problem = signal<string | undefined>(undefined);
  private readonly fetching = new Set<number>();

  constructor() {
    effect(() => {
      const [v, text] = [this.shown(), this.shownSource()];
      untracked(() => this.texts.update((m) => new Map(m).set(v, text)));
    });
    effect(() => {
      const p = this.pair();
      if (!p) return;
      for (const v of [p.older, p.newer]) if (!untracked(this.texts).has(v)) void this.fetch(v);
    });
  }

  protected tick(version: number): void {
    this.chosen.update((c) => toggleCompare(c, version));
  }

  protected link(version: number): string {
    return blockLink(this.base(), this.path(), version);
  }

  private async fetch(version: number): Promise<void> {
    if (this.fetching.has(version)) return;
    this.fetching.add(version);
    const path = this.path();
    try {
      const v = await this.api.version(this.slug(), path, version);
      if (path === this.path()) this.texts.update((m) => new Map(m).set(version, v.source));
      this.problem.set(undefined);
    } catch (err) {
      this.problem.set(apiErrorOf(err).message);
    } finally {
      this.fetching.delete(version);
    }
  }
}
