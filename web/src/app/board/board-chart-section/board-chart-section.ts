import { ChangeDetectionStrategy, Component, computed, input, signal } from '@angular/core';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatSelectModule } from '@angular/material/select';
import type { BoardData } from '@ringlet/shared/contracts/evaluation';
import { chartsFor } from '../board-charts';
import { ChartPanel } from '../chart-panel';

/** The board's charts for one item × measurand, chosen from a list. */
@Component({
  selector: 'app-board-chart-section',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatFormFieldModule, MatSelectModule, ChartPanel],
  templateUrl: './board-chart-section.html',
  styleUrl: '../board.scss',
})
export class BoardChartSection {
  readonly board = input.required<BoardData>();
  protected readonly group = signal(0);
  protected readonly charts = computed(() => chartsFor(this.board(), this.group()));
}
