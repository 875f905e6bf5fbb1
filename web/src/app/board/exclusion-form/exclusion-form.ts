import { ChangeDetectionStrategy, Component, computed, inject, input, output } from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule } from '@angular/forms';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';
import {
  EXCLUSION_RULES,
  EXCLUSION_RULE_LABELS,
  Exclusion,
  type EvaluationView,
} from '@ringlet/shared/contracts/evaluation';
import { EntryListForm } from '../../shared/entry-list-form';
import { ItemSelect, MeasurandSelect, measurandName } from '../../shared/round-part-selects';
import { firstIssue } from '../evaluation-page/evaluation-logic';

/** Excluding one participant's result from the assigned value (rule and reason), and those excluded. */
@Component({
  selector: 'app-exclusion-form',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [
    ReactiveFormsModule,
    MatFormFieldModule,
    MatInputModule,
    MatSelectModule,
    EntryListForm,
    ItemSelect,
    MeasurandSelect,
  ],
  templateUrl: './exclusion-form.html',
})
export class ExclusionForm {
  readonly view = input.required<Pick<EvaluationView, 'measurands' | 'items'>>();
  readonly exclusions = input.required<readonly Exclusion[]>();
  /** Participant codes with a result in this round. */
  readonly codes = input.required<ReadonlySet<string>>();
  readonly added = output<Exclusion>();
  readonly removed = output<number>();
  /** Why the exclusion was refused (null when it was taken). */
  readonly failed = output<string | null>();
  protected readonly rules = EXCLUSION_RULES;
  protected readonly labels = EXCLUSION_RULE_LABELS;
  protected readonly form = inject(NonNullableFormBuilder).group({
    participantCode: [''],
    itemCode: [''],
    measurandKey: [''],
    rule: ['confirmed-blunder' as Exclusion['rule']],
    reason: [''],
  });
  protected readonly entries = computed(() =>
    this.exclusions().map((x) => ({
      text: `${x.participantCode} · ${x.itemCode} · ${measurandName(this.view().measurands, x.measurandKey)}: ${this.labels[x.rule]} — ${x.reason}`,
      removeLabel: `Remove exclusion of ${x.participantCode}`,
    })),
  );

  protected add(): void {
    const v = this.form.getRawValue();
    const parsed = Exclusion.safeParse({ ...v, participantCode: v.participantCode.trim() });
    if (!parsed.success) {
      this.failed.emit(firstIssue(parsed.error, 'Exclusion', 'check the fields'));
      return;
    }
    if (!this.codes().has(parsed.data.participantCode)) {
      this.failed.emit(
        `Participant code: no result from ${parsed.data.participantCode} in this round.`,
      );
      return;
    }
    this.failed.emit(null);
    this.added.emit(parsed.data);
  }
}
