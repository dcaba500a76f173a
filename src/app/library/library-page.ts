import { ChangeDetectionStrategy, Component } from '@angular/core';

/** The team's block library: vetted, versioned blocks (catalogue arrives with the library issue). */
@Component({
  selector: 'nw-library-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <section class="page">
      <h1>Block library</h1>
      <p>Vetted mirrors, tails, pairs and level shifters your team reuses, each pinned by version.</p>
    </section>
  `,
  styles: `.page { padding: 24px; max-width: 960px; }`,
})
export class LibraryPage {}
