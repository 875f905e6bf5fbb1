import { ChangeDetectionStrategy, Component, type OnInit, inject, signal } from '@angular/core';
import { RouterLink } from '@angular/router';
import {
  CAUSE_CATEGORY_LABELS,
  INVESTIGATION_STATE_LABELS,
  type InvestigationDto,
} from '@ringlet/shared/contracts/evaluation';
import { AuthService } from '../core/auth-service';
import { SignalBadge } from '../core/signal-badge';
import { BoardService } from './board-service';

/** Investigations: a lab's own; every one for the coordinator; granting labs' for an assessor. */
@Component({
  selector: 'app-investigation-list',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [RouterLink, SignalBadge],
  styleUrl: './board.scss',
  template: `
    <section class="page">
      <h1 data-testid="page-heading">Investigations</h1>
      <p class="note">
        Each warning or action signal opens an investigation: cause, root cause, corrective action
        and an effectiveness check. The lab manager closes it.
      </p>
      @if (items().length === 0) {
        <p>{{ loading() ? 'Loading…' : 'No investigations.' }}</p>
      } @else {
        <div class="table-scroll">
          <table class="rl-table" aria-label="Investigations">
            <thead>
              <tr>
                <th>Round</th>
                <th>Lab</th>
                <th>Participant code</th>
                <th>Item · measurand</th>
                <th>Signal</th>
                <th class="num">Score</th>
                <th>Cause</th>
                <th>State</th>
              </tr>
            </thead>
            <tbody>
              @for (i of items(); track i.id) {
                <tr>
                  <td>
                    <a [routerLink]="['/board/investigations', i.id]">{{ i.roundCode }}</a>
                  </td>
                  <td>{{ i.labName }}</td>
                  <td>{{ i.participantCode }}</td>
                  <td>{{ i.itemCode }} · {{ i.measurandName }}</td>
                  <td><app-signal-badge [signal]="i.signal" /></td>
                  <td class="num">{{ i.score.toFixed(2) }}</td>
                  <td>{{ i.causeCategory ? causes[i.causeCategory] : '—' }}</td>
                  <td>{{ stateLabels[i.state] }}</td>
                </tr>
              }
            </tbody>
          </table>
        </div>
      }
    </section>
  `,
})
export class InvestigationList implements OnInit {
  protected readonly stateLabels = INVESTIGATION_STATE_LABELS;
  private readonly service = inject(BoardService);
  private readonly auth = inject(AuthService);
  protected readonly items = signal<InvestigationDto[]>([]);
  protected readonly loading = signal(true);
  protected readonly causes = CAUSE_CATEGORY_LABELS;

  ngOnInit(): void {
    const readsAll = this.auth.hasRole('coordinator') || this.auth.hasRole('assessor');
    (readsAll ? this.service.investigations() : this.service.myInvestigations()).subscribe({
      next: (l) => {
        this.items.set(l);
        this.loading.set(false);
      },
      error: () => this.loading.set(false),
    });
  }
}
