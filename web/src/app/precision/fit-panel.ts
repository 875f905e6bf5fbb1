import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import {
  PRECISION_RELATION_LABELS,
  type PrecisionFit,
  type PrecisionMeasurandResult,
} from '@ringlet/shared/contracts/precision';
import { ChartPanel } from '../board/chart-panel';
import { levelDependenceChart } from './precision-chart-data';
import { fix } from './precision-view';

/** The fitted level dependence of s_r and s_R of one measurand (ISO 5725-2 §7.5). */
@Component({
  selector: 'app-precision-fit',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [ChartPanel],
  templateUrl: './fit-panel.html',
  styleUrl: './precision.scss',
})
export class FitPanel {
  readonly measurand = input.required<PrecisionMeasurandResult>();
  protected readonly fix = fix;
  protected readonly relationLabels = PRECISION_RELATION_LABELS;
  protected readonly chart = computed(() => levelDependenceChart(this.measurand()));
  protected readonly fits = computed(() =>
    [
      { name: 's_r', fit: this.measurand().fit.sr },
      { name: 's_R', fit: this.measurand().fit.sR },
    ].filter((f): f is { name: string; fit: PrecisionFit } => f.fit !== null),
  );
  protected chosenEquation(fit: PrecisionFit): string | null {
    return fit.candidates.find((c) => c.relation === fit.chosen)?.equation ?? null;
  }
}
