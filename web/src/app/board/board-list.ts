import { ChangeDetectionStrategy, Component, OnInit, inject, signal } from '@angular/core';
import { RouterLink } from '@angular/router';
import type { BoardListEntry } from '@ringlet/shared/contracts/evaluation';
import { ROUND_STATE_LABELS, type RoundState } from '@ringlet/shared/contracts/round-states';
import { AuthService } from '../core/auth.service';
import { BoardService } from './board.service';

/** Rounds whose Consensus board the user may open, with the next step for each role. */
@Component({
  selector: 'app-board-list',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [RouterLink],
  template: `
    <section class="page">
      <h1 data-testid="page-heading">Consensus board</h1>
      <p class="page-actions"><a routerLink="/board/investigations">Investigations</a></p>
      @if (loading()) { <p>Loading…</p> }
      @else if (rounds().length === 0) {
        <p>No round has results to show yet.</p>
      } @else {
        <table class="rl-table" aria-label="Rounds">
          <thead><tr><th>Round</th><th>Title</th><th>State</th><th>Evaluation</th><th></th></tr></thead>
          <tbody>
            @for (r of rounds(); track r.roundId) {
              <tr>
                <td>{{ r.roundCode }}</td>
                <td>{{ r.roundTitle }}</td>
                <td>{{ stateLabel(r.roundState) }}</td>
                <td>{{ r.evaluationState ? r.evaluationState + ' · version ' + r.version : '—' }}</td>
                <td class="links">
                  @if (r.evaluationState) { <a [routerLink]="['/board/rounds', r.roundId]">Board</a> }
                  @if (isCoordinator()) { <a [routerLink]="['/board/rounds', r.roundId, 'evaluation']">Evaluation</a> }
                  @if (isLab() && r.evaluationState === 'published') { <a [routerLink]="['/board/rounds', r.roundId, 'scores']">My scores</a> }
                </td>
              </tr>
            }
          </tbody>
        </table>
      }
    </section>
  `,
  styles: `
    .links { display: flex; gap: 12px; }
  `,
})
export class BoardList implements OnInit {
  private readonly service = inject(BoardService);
  private readonly auth = inject(AuthService);
  protected readonly rounds = signal<BoardListEntry[]>([]);
  protected readonly loading = signal(true);
  protected readonly isCoordinator = () => this.auth.hasRole('coordinator');
  protected readonly isLab = () => this.auth.hasRole('lab');
  protected stateLabel(s: string): string {
    return ROUND_STATE_LABELS[s as RoundState] ?? s;
  }
  ngOnInit(): void {
    this.service.boards().subscribe({
      next: (r) => {
        this.rounds.set(r);
        this.loading.set(false);
      },
      error: () => this.loading.set(false),
    });
  }
}
