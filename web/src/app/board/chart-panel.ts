import { ChangeDetectionStrategy, Component, input, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { NgxEchartsDirective } from 'ngx-echarts';
import type { ChartOption } from '@ringlet/shared/charts/board-charts';

export interface ChartTable {
  readonly columns: readonly string[];
  readonly rows: readonly (readonly (string | number)[])[];
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
  readonly name = input.required<string>();
  readonly caption = input.required<string>();
  readonly option = input.required<ChartOption>();
  readonly text = input.required<string>();
  readonly table = input.required<ChartTable>();
  protected readonly showTable = signal(false);
  protected isNumber(v: unknown): boolean {
    return typeof v === 'number';
  }
}
