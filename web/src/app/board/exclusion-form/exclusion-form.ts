import { ChangeDetectionStrategy, Component, effect, inject, input, output } from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';
import {
  EXCLUSION_RULES,
  EXCLUSION_RULE_LABELS,
  Exclusion,
  type EvaluationView,
} from '@ringlet/shared/contracts/evaluation';
import { firstIssue } from '../evaluation-page/evaluation-logic';

/** Excluding one participant's result from the assigned value (rule and reason), and those excluded. */
@Component({
  selector: 'app-exclusion-form',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [
    ReactiveFormsModule,
    MatButtonModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatSelectModule,
  ],
  templateUrl: './exclusion-form.html',
  styleUrl: '../board.scss',
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

  constructor() {
    effect(() => {
      const v = this.view();
      const c = this.form.controls;
      if (!c.measurandKey.value && v.measurands[0]) c.measurandKey.setValue(v.measurands[0].key);
      if (!c.itemCode.value && v.items[0]) c.itemCode.setValue(v.items[0].code);
    });
  }

  protected measurandName(key: string): string {
    return this.view().measurands.find((m) => m.key === key)?.name ?? key;
  }

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
