import { HttpErrorResponse } from '@angular/common/http';
import {
  ChangeDetectionStrategy,
  Component,
  type OnInit,
  inject,
  input,
  signal,
} from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { RouterLink } from '@angular/router';
import type { InvitationAcceptResult } from '@ringlet/shared/contracts/rounds';
import { AuthService } from '../core/auth-service';
import { problemMessage } from '../core/problem';
import { PageLoad } from '../shared/page-load';
import { RoundsService } from './rounds-service';

/** The page an invitation e-mail links to: shows the round and enrols the lab on acceptance. */
@Component({
  selector: 'app-accept-invitation',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatButtonModule, RouterLink],
  template: `
    <section class="page">
      <h1 data-testid="page-heading">Invitation to a proficiency-testing round</h1>
      @if (info(); as i) {
        <p>
          Round <strong>{{ i.roundCode }}</strong> · {{ i.roundTitle }}
        </p>
        <p>
          {{
            i.isNewLab
              ? 'Accepting opens an account for ' +
                (i.labName ?? 'your lab') +
                ' at ' +
                i.email +
                '; a link to choose a password follows by e-mail.'
              : 'Sign in as a member of ' + i.labName + ' to accept.'
          }}
        </p>
        @if (!i.isNewLab && !auth.me()) {
          <p>
            <a routerLink="/sign-in" [queryParams]="{ returnUrl: '/invitations/' + token() }"
              >Sign in</a
            >
          </p>
        }
        @if (result(); as r) {
          <p role="status" data-testid="accepted">
            Enrolled. Your participant code for this round is
            <strong>{{ r.participantCode }}</strong>.
            {{ r.accountCreated ? 'Check your e-mail for the link to choose your password.' : '' }}
          </p>
        } @else {
          <button
            mat-flat-button
            type="button"
            (click)="accept()"
            [disabled]="busy()"
            data-testid="accept"
          >
            Accept and enrol
          </button>
        }
      }
      @if (failure(); as m) {
        <p class="form-error" role="alert">{{ m }}</p>
      }
    </section>
  `,
})
export class AcceptInvitation implements OnInit {
  readonly token = input.required<string>();
  protected readonly auth = inject(AuthService);
  private readonly api = inject(RoundsService);
  private readonly page = new PageLoad(() => this.api.invitationInfo(this.token()));
  protected readonly info = this.page.value;
  protected readonly result = signal<InvitationAcceptResult | null>(null);
  protected readonly failure = this.page.error;
  protected readonly busy = signal(false);

  ngOnInit(): void {
    this.page.load();
  }

  protected accept(): void {
    this.busy.set(true);
    this.failure.set(null);
    this.api.acceptInvitation(this.token()).subscribe({
      next: (r) => this.result.set(r),
      error: (e: unknown) => {
        this.busy.set(false);
        this.failure.set(
          e instanceof HttpErrorResponse && e.status === 401
            ? 'Sign in as a member of the invited lab first.'
            : problemMessage(e),
        );
      },
    });
  }
}
