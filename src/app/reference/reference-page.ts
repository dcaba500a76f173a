/**
 * `/reference`: the netlist language reference (docs/netlist.md, shipped with the app and kept by
 * the service worker, so it reads offline too), with a search that narrows to the sections
 * mentioning every word and marks the hits, and a table of contents that stays in view on wide
 * screens. `/reference#analyze-ac` opens at that section; an anchor the text does not have yet
 * falls back to the nearest section that covers it (see syntax-anchors.ts).
 */
import { HttpClient } from '@angular/common/http';
import { afterNextRender, ChangeDetectionStrategy, Component, computed, DestroyRef, effect, inject, Injector, signal, untracked } from '@angular/core';
import { takeUntilDestroyed, toSignal } from '@angular/core/rxjs-interop';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { DomSanitizer, type SafeHtml } from '@angular/platform-browser';
import { ActivatedRoute, RouterLink } from '@angular/router';
import { anchorsOf, parseReference, type ReferenceDoc } from './reference-doc';
import { countShown, highlight, narrow, queryWords } from './reference-search';
import { resolveAnchor } from './syntax-anchors';

/** Where the app serves docs/netlist.md (angular.json assets; prefetched by ngsw-config.json). */
export const REFERENCE_URL = '/docs/netlist.md';

type LoadState = { kind: 'loading' } | { kind: 'ready'; doc: ReferenceDoc } | { kind: 'failed'; message: string };

interface ShownSection {
  id: string;
  title: string;
  titleHtml: SafeHtml;
  bodyHtml?: SafeHtml;
}

interface ShownChapter extends ShownSection {
  sections: ShownSection[];
}

@Component({
  selector: 'nw-reference-page',
  imports: [RouterLink, MatFormFieldModule, MatInputModule, MatButtonModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    @switch (state().kind) {
      @case ('loading') {
        <p class="status pad" role="status">Loading the language reference…</p>
      }
      @case ('failed') {
        <section class="pad">
          <h1>Language reference</h1>
          <p class="status" role="alert">{{ failure() }}</p>
          <button mat-stroked-button type="button" (click)="load()">Try again</button>
        </section>
      }
      @case ('ready') {
        <div class="page">
          <aside class="side">
            <mat-form-field appearance="outline" subscriptSizing="dynamic" class="search">
              <mat-label>Search the reference</mat-label>
              <input matInput type="search" [value]="query()" (input)="search($any($event.target).value)"
                (keydown.escape)="search('')" autocomplete="off" />
            </mat-form-field>
            <p class="count" role="status">{{ countText() }}</p>
            <nav class="toc" aria-label="Contents of the reference">
              <ol>
                @for (c of shown(); track c.id) {
                  <li>
                    <a routerLink="/reference" [fragment]="c.id" [class.current]="current() === c.id" (click)="jump(c.id)">{{ c.title }}</a>
                    @if (c.sections.length > 0) {
                      <ol>
                        @for (s of c.sections; track s.id) {
                          <li><a routerLink="/reference" [fragment]="s.id" [class.current]="current() === s.id" (click)="jump(s.id)">{{ s.title }}</a></li>
                        }
                      </ol>
                    }
                  </li>
                }
              </ol>
            </nav>
          </aside>
          <article class="doc" aria-labelledby="nw-reference-title">
            <h1 id="nw-reference-title">{{ doc()?.title }}</h1>
            @if (words().length === 0) {
              <div class="md" [innerHTML]="introHtml()"></div>
            }
            @for (c of shown(); track c.id) {
              <section class="chapter" [attr.aria-labelledby]="c.id">
                <h2 [id]="c.id" tabindex="-1" [class.current]="current() === c.id" [innerHTML]="c.titleHtml"></h2>
                @if (c.bodyHtml) { <div class="md" [innerHTML]="c.bodyHtml"></div> }
                @for (s of c.sections; track s.id) {
                  <section [attr.aria-labelledby]="s.id">
                    <h3 [id]="s.id" tabindex="-1" [class.current]="current() === s.id" [innerHTML]="s.titleHtml"></h3>
                    <div class="md" [innerHTML]="s.bodyHtml"></div>
                  </section>
                }
              </section>
            } @empty {
              <p class="none">Nothing in the reference mentions every word of “{{ query().trim() }}”.
                <button mat-button type="button" (click)="search('')">Clear the search</button></p>
            }
          </article>
        </div>
      }
    }
  `,
  styles: `
    :host { display: block; }
    .pad { padding: 32px; max-width: 720px; margin: 0 auto; }
    .status { color: var(--mat-sys-on-surface-variant); }
    .page { display: grid; grid-template-columns: minmax(0, 1fr); gap: 8px 40px; max-width: 1240px; margin: 0 auto; padding: 20px 24px 48px; box-sizing: border-box; }
    .side { display: flex; flex-direction: column; gap: 6px; }
    .search { width: 100%; }
    .count { margin: 0; min-height: 1.2em; font-size: 0.875rem; color: var(--mat-sys-on-surface-variant); }
    .toc ol { list-style: none; margin: 0; padding: 0; }
    .toc > ol { columns: 2 220px; }
    .toc ol ol { display: none; }
    .toc li { break-inside: avoid; }
    .toc a { display: block; padding: 3px 8px; border-radius: 4px; color: var(--mat-sys-on-surface); text-decoration: none; font-size: 0.9375rem; }
    .toc a:hover { background: var(--mat-sys-surface-container); text-decoration: underline; }
    .toc a.current { background: var(--mat-sys-secondary-container); color: var(--mat-sys-on-secondary-container); font-weight: 600; }
    .toc ol ol a { padding-left: 22px; font-size: 0.875rem; color: var(--mat-sys-on-surface-variant); }
    /* Wide screens: the contents stay in view beside the text. */
    @media (min-width: 1000px) {
      .page { grid-template-columns: 260px minmax(0, 1fr); }
      .side { position: sticky; top: 0; align-self: start; max-height: 100vh; overflow: auto; padding: 12px 4px 16px 0; box-sizing: border-box; }
      .toc > ol { columns: auto; }
      .toc ol ol { display: block; }
    }
    .doc { max-width: 800px; min-width: 0; line-height: 1.55; font-size: 1rem; }
    .doc h1 { font: var(--mat-sys-headline-medium); margin: 4px 0 12px; }
    .doc h2 { font: var(--mat-sys-title-large); font-weight: 700; margin: 36px 0 8px; padding-top: 10px; border-top: 1px solid var(--mat-sys-outline-variant); }
    .doc h3 { font: var(--mat-sys-title-medium); font-weight: 700; margin: 24px 0 6px; }
    .doc h2, .doc h3 { scroll-margin-top: 12px; outline: none; }
    .doc h2.current, .doc h3.current { background: linear-gradient(90deg, var(--mat-sys-secondary-container), transparent 70%); border-radius: 4px; }
    /* The section jumped to is marked by its band; any other focused heading gets the ring. */
    .doc h2:focus-visible:not(.current), .doc h3:focus-visible:not(.current) { outline: 2px solid var(--mat-sys-tertiary); }
    .none { color: var(--mat-sys-on-surface-variant); }
    .md ::ng-deep {
      p, li { max-width: 72ch; }
      code { font-family: ui-monospace, "DejaVu Sans Mono", monospace; font-size: 0.875em; background: var(--mat-sys-surface-container);
        padding: 1px 4px; border-radius: 3px; }
      /* Code wraps rather than scrolls: no hidden text, no extra tab stops. */
      pre { white-space: pre-wrap; overflow-wrap: anywhere; background: var(--mat-sys-surface-container-lowest);
        border: 1px solid var(--mat-sys-outline-variant); border-radius: 6px; padding: 10px 12px; margin: 8px 0 14px; }
      pre code { background: none; padding: 0; font-size: 0.875rem; line-height: 1.45; }
      table { border-collapse: collapse; margin: 8px 0 14px; font-size: 0.9375rem; background: var(--mat-sys-surface-container-lowest); }
      th, td { border: 1px solid var(--mat-sys-outline-variant); padding: 4px 8px; text-align: left; vertical-align: top; }
      th { background: var(--mat-sys-surface-container-low); }
      blockquote { margin: 12px 0; padding: 8px 12px; border-left: 3px solid var(--mat-sys-tertiary);
        background: var(--mat-sys-surface-container); color: var(--mat-sys-on-surface-variant); }
      blockquote p { margin: 0; }
      mark { background: #f6d9a8; color: var(--mat-sys-on-surface); border-radius: 2px; padding: 0 1px; }
    }
    .doc h2 ::ng-deep mark, .doc h3 ::ng-deep mark { background: #f6d9a8; color: inherit; }
    .doc h2 ::ng-deep code, .doc h3 ::ng-deep code { font-family: ui-monospace, "DejaVu Sans Mono", monospace; font-size: 0.9em; }
  `,
})
export class ReferencePage {
  private readonly http = inject(HttpClient);
  private readonly sanitizer = inject(DomSanitizer);
  private readonly injector = inject(Injector);
  private readonly destroyRef = inject(DestroyRef);
  private readonly fragment = toSignal(inject(ActivatedRoute).fragment, { initialValue: null });

  protected readonly state = signal<LoadState>({ kind: 'loading' });
  protected readonly query = signal('');
  /** The section last jumped to (outlined briefly so the eye finds it). */
  protected readonly current = signal<string | undefined>(undefined);

  protected readonly failure = computed(() => { const s = this.state(); return s.kind === 'failed' ? s.message : ''; });
  protected readonly doc = computed(() => { const s = this.state(); return s.kind === 'ready' ? s.doc : undefined; });
  protected readonly words = computed(() => queryWords(this.query()));
  private readonly views = computed(() => { const d = this.doc(); return d ? narrow(d, this.words()) : []; });

  /**
   * The chapters as shown: sanitized HTML (reference-doc.ts) with the search hits marked, trusted
   * here once per query rather than on every change detection.
   */
  protected readonly shown = computed<ShownChapter[]>(() => {
    const words = this.words();
    const trust = (html: string) => this.sanitizer.bypassSecurityTrustHtml(highlight(html, words));
    return this.views().map((v) => ({
      id: v.chapter.id,
      title: v.chapter.title,
      titleHtml: trust(v.chapter.titleHtml),
      bodyHtml: v.showBody && v.chapter.html ? trust(v.chapter.html) : undefined,
      sections: v.sections.map((s) => ({ id: s.id, title: s.title, titleHtml: trust(s.titleHtml), bodyHtml: trust(s.html) })),
    }));
  });

  protected readonly introHtml = computed(() => { const d = this.doc(); return d ? this.sanitizer.bypassSecurityTrustHtml(d.introHtml) : ''; });

  protected readonly countText = computed(() => {
    const q = this.query().trim();
    if (!q) return '';
    const n = countShown(this.views());
    return n === 0 ? `Nothing matches “${q}”` : `${n} ${n === 1 ? 'section matches' : 'sections match'} “${q}”`;
  });

  constructor() {
    this.load();
    // Follow the address's #anchor once the text is there (and whenever it changes).
    effect(() => {
      const doc = this.doc();
      const id = doc ? resolveAnchor(this.fragment(), anchorsOf(doc)) : undefined;
      if (id) untracked(() => this.jump(id));
    });
  }

  /** Fetches and parses the reference (again, after a failure). */
  protected load(): void {
    this.state.set({ kind: 'loading' });
    this.http.get(REFERENCE_URL, { responseType: 'text' }).pipe(takeUntilDestroyed(this.destroyRef)).subscribe({
      next: (text) => this.state.set({ kind: 'ready', doc: parseReference(text) }),
      error: () => this.state.set({
        kind: 'failed',
        message: navigator.onLine === false
          ? 'This browser is offline and has not kept a copy of the reference yet. Open it once while online and it stays available.'
          : 'The reference could not be loaded from the server just now.',
      }),
    });
  }

  protected search(value: string): void {
    this.query.set(value);
  }

  /** Scrolls to a section and moves the focus there; a search that hides it is cleared first. */
  protected jump(id: string): void {
    if (!this.shown().some((c) => c.id === id || c.sections.some((s) => s.id === id))) this.query.set('');
    this.current.set(id);
    afterNextRender({
      write: () => {
        const el = document.getElementById(id);
        if (!el) return;
        el.scrollIntoView({ block: 'start' });
        el.focus({ preventScroll: true });
      },
    }, { injector: this.injector });
  }
}
