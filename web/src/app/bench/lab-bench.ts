import { ChangeDetectionStrategy, Component, computed, inject } from '@angular/core';
import { AuthService } from '../core/auth.service';

/** A lab's workspace (placeholder until the bench feature lands). */
@Component({
  selector: 'app-lab-bench',
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <section class="page">
      <h1 data-testid="page-heading">Lab bench</h1>
      <p>Welcome, {{ auth.me()?.name }}. Test item receipt, the instrument check and your results will be entered here.</p>
      @if (labs().length) {
        <p>Your {{ labs().length === 1 ? 'lab' : 'labs' }}: {{ labs().join(', ') }}</p>
      }
    </section>
  `,
})
export class LabBench {
  protected readonly auth = inject(AuthService);
  protected readonly labs = computed(() => this.auth.me()?.memberships.map((m) => m.organisationName) ?? []);
}
