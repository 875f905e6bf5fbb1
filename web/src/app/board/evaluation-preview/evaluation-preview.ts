import { sigmaPtRuleText } from '@ringlet/shared/contracts/rule-text';
import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import type { EvaluationView } from '@ringlet/shared/contracts/evaluation';
import {
  type EvaluationSettings,
  fix,
  groupChanged,
  previewOf,
  signalChanges,
  signalCounts,
} from '../evaluation-page/evaluation-logic';

/** The evaluation as it would be with the settings on screen, computed in the browser. */
@Component({
  selector: 'app-evaluation-preview',
  changeDetection: ChangeDetectionStrategy.OnPush,
  templateUrl: './evaluation-preview.html',
  styleUrl: '../board.scss',
})
export class EvaluationPreview {
  readonly view = input.required<EvaluationView>();
  readonly settings = input.required<EvaluationSettings>();
  protected readonly preview = computed(() => previewOf(this.view(), this.settings()));
  protected readonly changes = computed(() => signalChanges(this.view(), this.preview()));
  protected readonly fix = fix;
  protected readonly rule = sigmaPtRuleText;
  protected readonly counts = signalCounts;
  protected changed(gi: number): boolean {
    return groupChanged(this.preview()[gi], this.view().results[gi]);
  }
}
