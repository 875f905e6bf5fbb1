import { ChangeDetectionStrategy, Component, computed, input, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { NgxEchartsDirective } from 'ngx-echarts';
import type { ChartOption } from '@ringlet/shared/charts/board-charts';

export interface ChartTable {
  readonly columns: readonly string[];
  readonly rows: readonly (readonly (string | number)[])[];
}

/** What one panel shows: its chart, the text alternative and the same numbers as a table. */
export interface PanelChart {
  /** Names the figure's test id (`chart-<name>`). */
  readonly name: string;
  /** The table view's accessible name. */
  readonly caption: string;
  readonly option: ChartOption;
  readonly text: string;
  readonly table: ChartTable;
}

/** One chart with its text alternative (always shown) and a table view of the same numbers. */
@Component({
  selector: 'app-chart-panel',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [NgxEchartsDirective, MatButtonModule],
  template: `
    <figure class="chart" [attr.data-testid]="'chart-' + name()">
      @if (showTable()) {
        <div class="table-wrap">
          <table class="rl-table" [attr.aria-label]="caption()">
            <thead>
              <tr>
                @for (c of table().columns; track $index) {
                  <th>{{ c }}</th>
                }
              </tr>
            </thead>
            <tbody>
              @for (r of table().rows; track $index) {
                <tr>
                  @for (v of r; track $index) {
                    <td [class.num]="isNumber(v)">{{ v }}</td>
                  }
                </tr>
              }
            </tbody>
          </table>
        </div>
      } @else {
        <div
          echarts
          class="echart"
          [options]="option()"
          role="img"
          [attr.aria-label]="text()"
        ></div>
      }
      <figcaption>
        <span class="alt">{{ text() }}</span>
        <button
          mat-button
          type="button"
          (click)="showTable.set(!showTable())"
          [attr.aria-pressed]="showTable()"
        >
          {{ showTable() ? 'Show chart' : 'Show table' }}
        </button>
      </figcaption>
    </figure>
  `,
  styles: `
    .chart {
      margin: 0;
      border: 1px solid #d5dbe3;
      border-radius: 6px;
      padding: 8px;
      background: #fff;
    }
    .echart {
      height: 300px;
      width: 100%;
    }
    .table-wrap {
      max-height: 300px;
      overflow: auto;
    }
    figcaption {
      font-size: 12px;
      color: #4a5566;
      display: flex;
      gap: 8px;
      align-items: flex-start;
      justify-content: space-between;
    }
    .rl-table {
      border-collapse: collapse;
      width: 100%;
      font-size: 12px;
    }
    .rl-table th,
    .rl-table td {
      border-bottom: 1px solid #d5dbe3;
      padding: 2px 6px;
      text-align: left;
    }
    .rl-table td.num {
      text-align: right;
      font-variant-numeric: tabular-nums;
    }
  `,
})
export class ChartPanel {
  readonly chart = input.required<PanelChart>();
  protected readonly name = computed(() => this.chart().name);
  protected readonly caption = computed(() => this.chart().caption);
  protected readonly option = computed(() => this.chart().option);
  protected readonly text = computed(() => this.chart().text);
  protected readonly table = computed(() => this.chart().table);
  protected readonly showTable = signal(false);
  protected isNumber(v: unknown): boolean {
    return typeof v === 'number';
  }
}
