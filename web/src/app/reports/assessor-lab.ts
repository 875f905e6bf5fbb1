import { DecimalPipe } from '@angular/common';
import {
  ChangeDetectionStrategy,
  Component,
  type OnInit,
  computed,
  inject,
  input,
} from '@angular/core';
import { RouterLink } from '@angular/router';
import { INVESTIGATION_STATE_LABELS } from '@ringlet/shared/contracts/evaluation';
import { ROUND_STATE_LABELS, type RoundState } from '@ringlet/shared/contracts/round-states';
import { DownloadButton } from './download-button';
import { ReportDownloads } from './report-downloads';
import { PageLoad } from '../shared/page-load';
import { ReportsService } from './reports-service';

/** One granting lab: its rounds with report downloads, investigations, instrument checks, and its Evidence pack. */
@Component({
  selector: 'app-assessor-lab',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [RouterLink, DecimalPipe, DownloadButton, ReportDownloads],
  template: `
    <section class="page">
      <a routerLink="/assessor">← Labs</a>
      @if (detail(); as d) {
        <h1 data-testid="page-heading">{{ d.lab.name }}</h1>
        <p>
          Access from {{ d.lab.startsOn }}
          {{ d.lab.endsOn ? 'until ' + d.lab.endsOn : '(open-ended)' }}.
        </p>
        <h2>Evidence pack</h2>
        <p>
          One zip with every published round’s reports and workbook, this lab’s individual reports
          and certificates, its investigations, instrument checks, an audit extract and a manifest
          of SHA-256 checksums.
        </p>
        <app-download-button
          [path]="'/assessor/labs/' + d.lab.id + '/evidence.zip'"
          label="Evidence pack (zip)"
          testId="download-evidence"
        />

        <h2>Rounds</h2>
        @for (r of d.rounds; track r.roundId) {
          <article class="round" data-testid="round">
            <h3>{{ r.roundCode }} · {{ r.roundTitle }}</h3>
            <p>
              Participant code <strong>{{ r.participantCode }}</strong>.
              @if (r.version !== null) {
                Evaluation version {{ r.version }}, published {{ r.publishedAt?.slice(0, 10) }}.
                {{ r.warnings }} warning signal(s), {{ r.actions }} action signal(s).
                @if (r.reissueReason) {
                  <em>Reissued: {{ r.reissueReason }}</em>
                }
              } @else {
                Not published yet ({{ roundStateLabel(r.roundState) }}).
              }
            </p>
            @if (r.version !== null) {
              <app-report-downloads [roundId]="r.roundId" [labId]="d.lab.id" />
            }
          </article>
        } @empty {
          <p>This lab has taken part in no round yet.</p>
        }

        <h2>Investigations</h2>
        @if (d.investigations.length === 0) {
          <p>No investigation.</p>
        } @else {
          <table class="plain" aria-label="Investigations">
            <thead>
              <tr>
                <th>Round</th>
                <th>Item</th>
                <th>Measurand</th>
                <th class="num">Score</th>
                <th>Signal</th>
                <th>State</th>
                <th>Root cause</th>
                <th>Corrective action</th>
                <th>Effectiveness check</th>
              </tr>
            </thead>
            <tbody>
              @for (i of d.investigations; track i.id) {
                <tr>
                  <td>{{ i.roundCode }}</td>
                  <td>{{ i.itemCode }}</td>
                  <td>{{ i.measurandName }}</td>
                  <td class="num">{{ i.score | number: '1.2-2' }}</td>
                  <td>{{ i.signal === 'action' ? 'action signal' : 'warning signal' }}</td>
                  <td>{{ investigationStateLabels[i.state] }}</td>
                  <td>{{ i.rootCause }}</td>
                  <td>{{ i.correctiveAction }}</td>
                  <td>{{ i.effectivenessCheck }}</td>
                </tr>
              }
            </tbody>
          </table>
        }

        <h2>Instrument checks</h2>
        @if (d.instrumentChecks.length === 0) {
          <p>No instrument check recorded.</p>
        } @else {
          <table class="plain" aria-label="Instrument checks">
            <thead>
              <tr>
                <th>Date</th>
                <th>Instrument</th>
                <th>Reference material</th>
                <th class="num">Reference (nm)</th>
                <th class="num">Tolerance (nm)</th>
                <th>Result</th>
              </tr>
            </thead>
            <tbody>
              @for (c of d.instrumentChecks; track c.id) {
                <tr>
                  <td>{{ c.checkedAt.slice(0, 10) }}</td>
                  <td>{{ c.instrument }}</td>
                  <td>{{ c.material }}</td>
                  <td class="num">{{ c.referenceValueNm | number: '1.1-1' }}</td>
                  <td class="num">{{ c.toleranceNm | number: '1.1-1' }}</td>
                  <td>{{ c.passed ? 'Pass' : 'Fail' }}</td>
                </tr>
              }
            </tbody>
          </table>
        }
      } @else if (missing()) {
        <h1 data-testid="page-heading">Lab not available</h1>
        <p>This lab has no active grant for you.</p>
      } @else {
        <p>Loading…</p>
      }
    </section>
  `,
  styleUrl: './reports.scss',
})
export class AssessorLab implements OnInit {
  protected readonly investigationStateLabels = INVESTIGATION_STATE_LABELS;
  protected roundStateLabel(s: string): string {
    return ROUND_STATE_LABELS[s as RoundState] ?? s;
  }
  readonly id = input.required<string>();
  private readonly reports = inject(ReportsService);
  /** Any refusal means the lab is not available to this assessor (no active grant). */
  private readonly page = new PageLoad(() => this.reports.lab(this.id()));
  protected readonly detail = this.page.value;
  protected readonly missing = computed(() => this.page.error() !== null);

  ngOnInit(): void {
    this.page.load();
  }
}
