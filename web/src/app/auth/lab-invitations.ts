import { DatePipe } from '@angular/common';
import { HttpClient, HttpContext } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, type OnInit, inject, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { RouterLink } from '@angular/router';
import * as z from 'zod';
import { LabInvitation } from '@ringlet/shared/contracts/admin';
import { Me, homePath } from '@ringlet/shared/contracts/auth';
import { API, HANDLED_STATUSES } from '../core/api';
import { AuthService } from '../core/auth-service';
import { problemMessage } from '../core/problem';

const handled = { context: new HttpContext().set(HANDLED_STATUSES, [404, 422]) };

/**
 * Invitations from labs to join them (the e-mailed link leads here). Nobody becomes a lab member
 * without accepting here.
 */
@Component({
  selector: 'app-lab-invitations',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [DatePipe, RouterLink, MatButtonModule],
  template: `
    <section class="page">
      <h1 data-testid="page-heading">Lab invitations</h1>
      @if (loading()) {
        <p>Loading your invitations…</p>
      } @else if (invitations().length === 0) {
        <p data-testid="no-invitations">You have no open invitations.</p>
        @if (joined(); as name) {
          <p role="status" data-testid="joined">
            You are now a member of {{ name }}. <a [routerLink]="home()">Go to your start page</a>
          </p>
        }
      } @else {
        <p>
          You become a member of a lab only if you accept. A lab member sees the lab's rounds,
          results and reports.
        </p>
        <ul class="invitations" data-testid="invitations">
          @for (i of invitations(); track i.id) {
            <li [attr.data-lab]="i.organisationName">
              <div>
                <strong>{{ i.organisationName }}</strong>
                invites you to join{{ i.isManager ? ' as a lab manager' : '' }}.
                <small
                  >Sent by {{ i.invitedByName ?? 'a lab manager' }} on
                  {{ i.createdAt | date: 'mediumDate' }}; open until
                  {{ i.expiresAt | date: 'mediumDate' }}.</small
                >
              </div>
              <div class="actions">
                <button
                  mat-flat-button
                  type="button"
                  [disabled]="busy()"
                  (click)="answer(i, true)"
                  [attr.aria-label]="'Accept the invitation from ' + i.organisationName"
                >
                  Accept
                </button>
                <button
                  mat-button
                  type="button"
                  [disabled]="busy()"
                  (click)="answer(i, false)"
                  [attr.aria-label]="'Decline the invitation from ' + i.organisationName"
                >
                  Decline
                </button>
              </div>
            </li>
          }
        </ul>
        @if (joined(); as name) {
          <p role="status" data-testid="joined">You are now a member of {{ name }}.</p>
        }
      }
      @if (failure(); as message) {
        <p class="form-error" role="alert">{{ message }}</p>
      }
    </section>
  `,
  styles: `
    .invitations {
      list-style: none;
      padding: 0;
      max-width: 760px;
    }
    .invitations li {
      display: flex;
      flex-wrap: wrap;
      gap: 12px;
      justify-content: space-between;
      align-items: center;
      padding: 12px 0;
      border-bottom: 1px solid #d8dde3;
    }
    .invitations small {
      display: block;
      color: #4a5663;
      margin-top: 4px;
    }
    .actions {
      display: flex;
      gap: 8px;
    }
  `,
})
export class LabInvitations implements OnInit {
  private readonly http = inject(HttpClient);
  private readonly auth = inject(AuthService);
  protected readonly invitations = signal<LabInvitation[]>([]);
  protected readonly loading = signal(true);
  protected readonly busy = signal(false);
  protected readonly failure = signal<string | null>(null);
  protected readonly joined = signal<string | null>(null);
  protected readonly home = () => homePath(this.auth.roles());

  ngOnInit(): void {
    this.http.get<unknown>(`${API}/my/lab-invitations`).subscribe({
      next: (body) => {
        this.invitations.set(z.array(LabInvitation).parse(body));
        this.loading.set(false);
      },
      error: (error: unknown) => {
        this.loading.set(false);
        this.failure.set(problemMessage(error));
      },
    });
  }

  protected answer(invitation: LabInvitation, accept: boolean): void {
    this.busy.set(true);
    this.failure.set(null);
    const url = `${API}/my/lab-invitations/${invitation.id}/${accept ? 'accept' : 'decline'}`;
    this.http.post<unknown>(url, null, handled).subscribe({
      next: (body) => {
        this.busy.set(false);
        this.invitations.update((list) => list.filter((i) => i.id !== invitation.id));
        if (accept) {
          this.auth.setMe(Me.parse(body));
          this.joined.set(invitation.organisationName);
        }
      },
      error: (error: unknown) => {
        this.busy.set(false);
        this.failure.set(problemMessage(error));
        this.invitations.update((list) => list.filter((i) => i.id !== invitation.id));
      },
    });
  }
}
