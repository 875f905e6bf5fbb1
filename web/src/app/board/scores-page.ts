import { ChangeDetectionStrategy, Component, type OnInit, inject, input } from '@angular/core';
import { formatDate } from '../core/format';
import { RouterLink } from '@angular/router';
import type { LabScores } from '@ringlet/shared/contracts/evaluation';
import { problemMessage, problemOf } from '../core/problem';
import { SignalBadge } from '../core/signal-badge';
import { PageLoad } from '../shared/page-load';
import { BoardService } from './board-service';

/** A lab's own scores of a published round, each with a plain-language explanation. */
@Component({
  selector: 'app-scores-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [RouterLink, SignalBadge],
  styleUrl: './board.scss',
  template: `
    <section class="page">
      <h1 data-testid="page-heading">My scores{{ data() ? ': ' + data()!.roundCode : '' }}</h1>
      @if (error()) {
        <p class="form-error" role="alert">{{ error() }}</p>
      }
      @if (data(); as d) {
        <p class="note">
          {{ d.labName }} took part as
          <strong data-testid="own-code">{{ d.participantCode }}</strong>. Other labs appear by
          their codes only. Evaluation version {{ d.version
          }}{{ d.publishedAt ? ', published ' + date(d.publishedAt) : '' }}.
        </p>
        @if (d.reissueReason) {
          <p class="note" data-testid="reissue-reason">Corrected version: {{ d.reissueReason }}</p>
        }
        <div class="table-scroll">
          <table class="rl-table" aria-label="My scores">
            <thead>
              <tr>
                <th>Item</th>
                <th>Measurand</th>
                <th class="num">Result</th>
                <th class="num">x_pt</th>
                <th class="num">σ_pt</th>
                <th class="num">Score</th>
                <th>Signal</th>
              </tr>
            </thead>
            <tbody>
              @for (s of d.scores; track s.itemCode + s.measurandKey) {
                <tr>
                  <td>{{ s.itemCode }}</td>
                  <td>{{ s.measurandName }}{{ s.unit ? ' (' + s.unit + ')' : '' }}</td>
                  <td class="num">{{ s.score.result.toFixed(s.decimals) }}</td>
                  <td class="num">
                    {{ s.assignedValue === null ? '—' : s.assignedValue.toFixed(s.decimals) }}
                  </td>
                  <td class="num">
                    {{ s.sigmaPt === null ? '—' : s.sigmaPt.toFixed(s.decimals + 1) }}
                  </td>
                  <td class="num">{{ scoreOf(s) }}</td>
                  <td>
                    @if (s.score.signal) {
                      <app-signal-badge [signal]="s.score.signal" />
                    } @else {
                      —
                    }
                  </td>
                </tr>
              }
            </tbody>
          </table>
        </div>
        @for (s of d.scores; track s.itemCode + s.measurandKey) {
          <article
            class="score-card"
            [attr.data-testid]="'score-' + s.itemCode + '-' + s.measurandKey"
          >
            <h2>
              Item {{ s.itemCode }} · {{ s.measurandName }}
              @if (s.score.signal) {
                <app-signal-badge [signal]="s.score.signal" />
              }
            </h2>
            <div class="explain">
              @for (line of s.explanation; track $index) {
                <p>{{ line }}</p>
              }
            </div>
            @if (s.investigationId) {
              <p>
                <a [routerLink]="['/board/investigations', s.investigationId]"
                  >Open the investigation</a
                >
              </p>
            }
          </article>
        }
        <p class="links">
          <a [routerLink]="['/board/rounds', d.roundId]">Consensus board</a
          ><a routerLink="/bench/track-record">Track record</a>
        </p>
      } @else if (!error()) {
        <p>Loading…</p>
      }
    </section>
  `,
})
export class ScoresPage implements OnInit {
  readonly id = input.required<string>();
  private readonly service = inject(BoardService);
  private readonly page = new PageLoad(
    () => this.service.myScores(this.id()),
    (e) =>
      problemOf(e)?.code === 'precision_study_no_scores'
        ? 'This round is a precision study: it estimates the method’s repeatability and reproducibility and does not score labs.'
        : problemMessage(e),
  );
  protected readonly data = this.page.value;
  protected readonly error = this.page.error;

  ngOnInit(): void {
    this.page.load();
  }

  protected scoreOf(s: LabScores['scores'][number]): string {
    const v = s.score.scoreKind === 'z' ? s.score.z : s.score.zPrime;
    return v === null ? '—' : `${s.score.scoreKind === 'z' ? 'z' : 'z′'} = ${v.toFixed(2)}`;
  }

  protected date(iso: string): string {
    return formatDate(iso);
  }
}
