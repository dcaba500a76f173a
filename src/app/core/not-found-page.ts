import { ChangeDetectionStrategy, Component } from '@angular/core';
import { RouterLink } from '@angular/router';

@Component({
  selector: 'nw-not-found-page',
  imports: [RouterLink],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <section class="page">
      <h1>Nothing here</h1>
      <p>This address does not lead to a page. <a routerLink="/bench">Back to the bench</a>.</p>
    </section>
  `,
  styles: `.page { padding: 24px; }`,
})
export class NotFoundPage {}
