import { ChangeDetectionStrategy, Component } from '@angular/core';

/** A lab's history across rounds (placeholder until the board feature lands). */
@Component({
  selector: 'app-track-record',
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <section class="page">
      <h1 data-testid="page-heading">Track record</h1>
      <p>Your lab's scores across rounds will show here once results are published.</p>
    </section>
  `,
})
export class TrackRecord {}
