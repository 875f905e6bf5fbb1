import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { AuthService } from '../core/auth.service';

/** The coordinator's workspace (placeholder until the rounds feature lands). */
@Component({
  selector: 'app-round-desk',
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <section class="page">
      <h1 data-testid="page-heading">Round desk</h1>
      <p>Welcome, {{ auth.me()?.name }}. Schemes, rounds, test items and enrolments will be run from here.</p>
    </section>
  `,
})
export class RoundDesk {
  protected readonly auth = inject(AuthService);
}
