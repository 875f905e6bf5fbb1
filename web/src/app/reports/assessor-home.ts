import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { AuthService } from '../core/auth.service';

/** The assessor's start page (placeholder until evidence packs land). */
@Component({
  selector: 'app-assessor-home',
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <section class="page">
      <h1 data-testid="page-heading">Assessor</h1>
      <p>Welcome, {{ auth.me()?.name }}. Evidence packs from labs that granted you access will be listed here.</p>
    </section>
  `,
})
export class AssessorHome {
  protected readonly auth = inject(AuthService);
}
