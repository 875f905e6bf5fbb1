import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { RouterLink } from '@angular/router';
import { AuthService } from './auth-service';

@Component({
  selector: 'app-no-role',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [RouterLink],
  template: `
    <section class="page">
      <h1 data-testid="page-heading">No role yet</h1>
      <p>
        You are signed in as {{ auth.me()?.email }}, but your account has no role and belongs to no
        lab yet. Ask your PT provider's administrator to give you access.
      </p>
      <p>
        If a lab invited you to join, <a routerLink="/lab-invitations">answer the invitation</a>.
      </p>
    </section>
  `,
})
export class NoRole {
  protected readonly auth = inject(AuthService);
}
