import {
  ChangeDetectionStrategy,
  Component,
  type OnInit,
  computed,
  inject,
  signal,
} from '@angular/core';
import { RouterLink } from '@angular/router';
import { provideEchartsCore } from 'ngx-echarts';
import type { TrackRecord as TrackRecordData } from '@ringlet/shared/contracts/evaluation';
import { trackOption, trackText } from '@ringlet/shared/charts/board-charts';
import { ChartPanel } from '../board/chart-panel';
import { BoardService } from '../board/board-service';
import { SignalBadge } from '../core/signal-badge';

/** A lab's Track record: z-scores across rounds per measurand, run rules and RSZ. */
@Component({
  selector: 'app-track-record',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [ChartPanel, RouterLink, SignalBadge],
  providers: [
    provideEchartsCore({ echarts: () => import('../board/echarts-setup').then((m) => m.echarts) }),
  ],
  template: `
    <section class="page">
      <h1 data-testid="page-heading">Track record</h1>
      @if (data(); as d) {
        <p class="note">
          {{ d.labName }}: z-scores of published rounds, oldest first. Run rules: an action signal;
          two results beyond ±2 in a row; nine results in a row on one side; the rescaled sum of
          z-scores RSZ = Σz/√n beyond ±2.
        </p>
        @if (d.series.length === 0) {
          <p>Your lab's scores across rounds will show here once results are published.</p>
        }
        @for (s of series(); track s.measurandKey) {
          <h2>{{ s.measurandName }}</h2>
          <p>
            RSZ =
            <strong [attr.data-testid]="'rsz-' + s.measurandKey">{{
              s.rsz === null ? '—' : s.rsz.toFixed(2)
            }}</strong>
            over {{ s.points.length }} scores.
          </p>
          @if (s.findings.length) {
            <ul [attr.data-testid]="'findings-' + s.measurandKey">
              @for (f of s.findings; track $index) {
                <li>{{ f.roundCode }}: {{ f.message }}</li>
              }
            </ul>
          } @else {
            <p>No run rule fired.</p>
          }
          <app-chart-panel
            [chart]="{
              name: 'track-' + s.measurandKey,
              caption: s.measurandName + ' z-scores',
              option: s.option,
              text: s.text,
              table: s.table,
            }"
          />
          <table class="visually-hidden" [attr.aria-label]="s.measurandName + ' scores'">
            <tbody>
              @for (p of s.points; track $index) {
                <tr>
                  <td>{{ p.roundCode }} {{ p.itemCode }}</td>
                  <td>{{ p.z.toFixed(2) }}</td>
                  <td><app-signal-badge [signal]="p.signal" /></td>
                </tr>
              }
            </tbody>
          </table>
        }
        <p>
          <a routerLink="/board">Consensus board</a> ·
          <a routerLink="/board/investigations">Investigations</a>
        </p>
      } @else {
        <p>Loading…</p>
      }
    </section>
  `,
  styles: `
    .note {
      color: #4a5566;
      font-size: 13px;
    }
  `,
})
export class TrackRecord implements OnInit {
  private readonly service = inject(BoardService);
  protected readonly data = signal<TrackRecordData | null>(null);
  protected readonly series = computed(() =>
    (this.data()?.series ?? []).map((s) => {
      const pts = s.points.map((p) => ({
        label: `${p.roundCode} ${p.itemCode}`,
        z: p.z,
        signal: p.signal,
      }));
      return {
        ...s,
        option: trackOption(pts, `${s.measurandName}: z across rounds`),
        text: trackText(pts, s.rsz, s.measurandName),
        table: {
          columns: ['round · item', 'z', 'signal'],
          rows: pts.map((p) => [p.label, Number(p.z.toFixed(2)), p.signal]),
        },
      };
    }),
  );

  ngOnInit(): void {
    this.service.trackRecord().subscribe({
      next: (d) => this.data.set(d),
      error: () => this.data.set({ labId: '', labName: '', series: [] }),
    });
  }
}
