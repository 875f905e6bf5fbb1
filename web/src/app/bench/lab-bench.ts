import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, effect, inject, signal } from '@angular/core';
import { RouterLink } from '@angular/router';
import type { MyRound, MyRoundStatus } from '@ringlet/shared/contracts/bench';
import { LabChooser } from '../core/lab-chooser';
import { BenchService } from './bench-service';

export const STATUS_LABELS: Record<MyRoundStatus, string> = {
  invited: 'Invited',
  enrolled: 'Enrolled',
  'due-soon': 'Due soon',
  submitted: 'Submitted',
  locked: 'Locked, not submitted',
  published: 'Published',
  withdrawn: 'Withdrawn',
};

/** The Lab bench home: the lab's rounds with their deadlines. */
@Component({
  selector: 'app-lab-bench',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [DatePipe, RouterLink, LabChooser],
  template: `
    <section class="page">
      <h1 data-testid="page-heading">Lab bench</h1>
      @if (bench.labs().length > 1 && !bench.labId()) {
        <p data-testid="choose-lab">You belong to several labs. Choose the lab you act for:</p>
        <app-lab-chooser />
      } @else if (loading()) {
        <p>Loading your rounds…</p>
      } @else if (rounds().length === 0) {
        <p data-testid="no-rounds">
          Your lab has no rounds yet. Invitations from the PT provider appear here.
        </p>
      } @else {
        <div class="table-scroll">
          <table class="bench-table" data-testid="my-rounds">
            <caption class="visually-hidden">
              Your lab’s rounds
            </caption>
            <thead>
              <tr>
                <th scope="col">Round</th>
                <th scope="col">Participant code</th>
                <th scope="col">Status</th>
                <th scope="col">Results due</th>
                <th scope="col">Locks at</th>
                <th scope="col" class="num">Version</th>
              </tr>
            </thead>
            <tbody>
              @for (r of rounds(); track r.roundId) {
                <tr [attr.data-status]="r.status">
                  <td>
                    @if (r.kind === 'precision') {
                      <span class="kind" data-testid="round-kind">Precision study</span>
                    }
                    @if (r.status !== 'invited') {
                      <a [routerLink]="['/bench/rounds', r.roundId]"
                        >{{ r.code }} · {{ r.title }}</a
                      >
                    } @else {
                      {{ r.code }} · {{ r.title }}
                    }
                  </td>
                  <td>{{ r.participantCode ?? '—' }}</td>
                  <td>
                    <span class="status status-{{ r.status }}">{{ labels[r.status] }}</span>
                  </td>
                  <td>{{ r.resultsDueAt ? (r.resultsDueAt | date: 'medium') : '—' }}</td>
                  <td>
                    {{ r.locksAt ? (r.locksAt | date: 'medium') : '—' }}
                    @if (r.extensionUntil) {
                      <small> (extension)</small>
                    }
                  </td>
                  <td class="num">{{ r.submittedVersion || '—' }}</td>
                </tr>
              }
            </tbody>
          </table>
        </div>
      }
    </section>
  `,
  styles: `
    .bench-table {
      border-collapse: collapse;
      width: 100%;
      min-width: 640px;
      font-size: 14px;
    }
    .bench-table th,
    .bench-table td {
      text-align: left;
      padding: 6px 10px;
      border-bottom: 1px solid #d8dde3;
    }
    .bench-table .num {
      text-align: right;
    }
    .status {
      font-weight: 500;
    }
    .kind {
      display: block;
      font-size: 12px;
      color: #1f3a5f;
    }
    .status-due-soon {
      color: var(--rl-saffron);
    }
    .status-submitted,
    .status-published {
      color: var(--rl-teal);
    }
    .status-locked {
      color: var(--rl-carmine);
    }
    .visually-hidden {
      position: absolute;
      width: 1px;
      height: 1px;
      overflow: hidden;
      clip: rect(0 0 0 0);
    }
  `,
})
export class LabBench {
  protected readonly bench = inject(BenchService);
  protected readonly rounds = signal<MyRound[]>([]);
  protected readonly loading = signal(true);
  protected readonly labels = STATUS_LABELS;

  constructor() {
    // Loads the rounds of the lab acted for, again whenever the lab chooser changes it.
    effect(() => {
      if (this.bench.labId()) this.load();
    });
  }

  private load(): void {
    this.loading.set(true);
    this.bench.myRounds().subscribe({
      next: (r) => {
        this.rounds.set(r);
        this.loading.set(false);
      },
      error: () => this.loading.set(false),
    });
  }
}
