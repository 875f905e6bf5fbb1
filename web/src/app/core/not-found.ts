import { ChangeDetectionStrategy, Component } from '@angular/core';
import { RouterLink } from '@angular/router';

@Component({
  selector: 'app-not-found',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [RouterLink],
  template: `
    <section class="page">
      <h1 data-testid="page-heading">Page not found</h1>
      <p>There is nothing at this address. It may have moved, or the link may be mistyped.</p>
      <p><a routerLink="/">Go to your home page</a></p>
    </section>
  `,
})
export class NotFound {}
