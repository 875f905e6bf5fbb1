import {
  ChangeDetectionStrategy,
  Component,
  type OnInit,
  computed,
  inject,
  signal,
} from '@angular/core';
import { formatDateTime } from '../core/format';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatListModule } from '@angular/material/list';
import type { OutboxMessage } from '@ringlet/shared/contracts/admin';
import { AuthService } from '../core/auth-service';
import { linkify } from './linkify';
import { OutboxService } from './outbox-service';

/** The development mail viewer: captured e-mails, newest first; links in them are clickable. */
@Component({
  selector: 'app-outbox',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatListModule, MatButtonModule, MatIconModule],
  template: `
    <section class="page outbox">
      <h1 data-testid="page-heading">Outbox</h1>
      <div class="page-actions">
        <p class="note" data-testid="outbox-scope">
          Mail the server captured instead of sending{{
            isAdmin() ? ': every message (you are an admin).' : ', addressed to you.'
          }}
          Only in demo and development mode.
        </p>
        <button mat-button type="button" (click)="reload()">
          <mat-icon>refresh</mat-icon> Refresh
        </button>
      </div>
      <div class="panes">
        @if (messages().length === 0) {
          <p class="empty list">No e-mails yet.</p>
        } @else {
          <mat-selection-list
            [multiple]="false"
            aria-label="Captured e-mails"
            class="list"
            hideSingleSelectionIndicator
          >
            @for (message of messages(); track message.id) {
              <mat-list-option
                [value]="message.id"
                [selected]="message.id === selectedId()"
                (click)="selectedId.set(message.id)"
                (keydown.enter)="selectedId.set(message.id)"
              >
                <span matListItemTitle>{{ message.subject }}</span>
                <span matListItemLine
                  >{{ message.to.join(', ') }} · {{ when(message.receivedAt) }}</span
                >
              </mat-list-option>
            }
          </mat-selection-list>
        }
        @if (selected(); as message) {
          <article class="message" data-testid="outbox-message" aria-live="polite">
            <h2>{{ message.subject }}</h2>
            <dl>
              <dt>From</dt>
              <dd>{{ message.from }}</dd>
              <dt>To</dt>
              <dd>{{ message.to.join(', ') }}</dd>
              <dt>Received</dt>
              <dd>{{ when(message.receivedAt) }}</dd>
            </dl>
            <div class="body">
              @for (part of parts(); track $index) {
                @if ('href' in part) {
                  <a [href]="part.href">{{ part.href }}</a>
                } @else {
                  <span>{{ part.text }}</span>
                }
              }
            </div>
          </article>
        }
      </div>
    </section>
  `,
  styles: `
    .note {
      margin: 0;
      color: var(--mat-sys-on-surface-variant);
    }
    .panes {
      display: grid;
      grid-template-columns: minmax(240px, 1fr) 2fr;
      gap: 16px;
    }
    .list {
      border: 1px solid var(--mat-sys-outline-variant);
      border-radius: 6px;
      max-height: 70vh;
      overflow: auto;
    }
    .message {
      border: 1px solid var(--mat-sys-outline-variant);
      border-radius: 6px;
      padding: 12px 16px;
    }
    dl {
      display: grid;
      grid-template-columns: max-content 1fr;
      gap: 2px 12px;
      margin: 0 0 12px;
    }
    dt {
      color: var(--mat-sys-on-surface-variant);
    }
    dd {
      margin: 0;
    }
    .body {
      white-space: pre-wrap;
      word-break: break-word;
      font: inherit;
      margin: 0;
    }
    .empty {
      padding: 12px 16px;
    }
    @media (max-width: 800px) {
      .panes {
        grid-template-columns: 1fr;
      }
    }
  `,
})
export class Outbox implements OnInit {
  private readonly outbox = inject(OutboxService);
  private readonly auth = inject(AuthService);
  protected readonly isAdmin = computed(() => this.auth.hasRole('admin'));
  protected readonly messages = signal<OutboxMessage[]>([]);
  protected readonly selectedId = signal<string | null>(null);
  protected readonly selected = computed(
    () => this.messages().find((m) => m.id === this.selectedId()) ?? null,
  );
  protected readonly parts = computed(() => linkify(this.selected()?.text ?? ''));

  ngOnInit(): void {
    this.reload();
  }

  protected reload(): void {
    this.outbox.messages().subscribe((messages) => {
      this.messages.set(messages);
      if (!messages.some((m) => m.id === this.selectedId()))
        this.selectedId.set(messages[0]?.id ?? null);
    });
  }

  protected when(iso: string): string {
    return formatDateTime(iso);
  }
}
