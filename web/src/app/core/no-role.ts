import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { AuthService } from './auth.service';

@Component({
  selector: 'app-no-role',
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <section class="page">
      <h1 data-testid="page-heading">No role yet</h1>
      <p>
        You are signed in as {{ auth.me()?.email }}, but your account has no role and belongs to no
        lab yet. Ask your PT provider's administrator to give you access.
      </p>
    </section>
  `,
})
export class NoRole {
  protected readonly auth = inject(AuthService);
}
