import { sigmaPtRuleText } from '@ringlet/shared/contracts/rule-text';
import { ChangeDetectionStrategy, Component, computed, inject, input, output } from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { NonNullableFormBuilder, ReactiveFormsModule } from '@angular/forms';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';
import { type EvaluationView, SigmaPtOverride } from '@ringlet/shared/contracts/evaluation';
import { EntryListForm } from '../../shared/entry-list-form';
import { ItemSelect, MeasurandSelect, measurandName } from '../../shared/round-part-selects';
import { firstIssue, overrideRule } from '../evaluation-page/evaluation-logic';

type OverrideKind = 'robust-sd' | 'percent' | 'fixed';

/** A σ_pt rule for one measurand (every item or one), with its reason, and the rules set so far. */
@Component({
  selector: 'app-sigma-override-form',
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
  templateUrl: './sigma-override-form.html',
})
export class SigmaOverrideForm {
  readonly view = input.required<Pick<EvaluationView, 'measurands' | 'items'>>();
  readonly overrides = input.required<readonly SigmaPtOverride[]>();
  /** A valid rule to apply. */
  readonly added = output<SigmaPtOverride>();
  /** The index of a rule to take back. */
  readonly removed = output<number>();
  /** Why the rule was refused (null when it was taken). */
  readonly failed = output<string | null>();
  protected readonly form = inject(NonNullableFormBuilder).group({
    measurandKey: [''],
    itemCode: [null as string | null],
    kind: ['percent' as OverrideKind],
    value: [null as number | null],
    reason: [''],
  });
  protected readonly kind = toSignal(this.form.controls.kind.valueChanges, {
    initialValue: this.form.controls.kind.value,
  });
  protected readonly entries = computed(() =>
    this.overrides().map((o) => {
      const name = measurandName(this.view().measurands, o.measurandKey);
      return {
        text: `${name} · ${o.itemCode ?? 'every item'}: ${sigmaPtRuleText(o.rule)} — ${o.reason}`,
        removeLabel: `Remove σ_pt rule for ${name}`,
      };
    }),
  );

  protected add(): void {
    const v = this.form.getRawValue();
    const parsed = SigmaPtOverride.safeParse({
      measurandKey: v.measurandKey,
      itemCode: v.itemCode,
      rule: overrideRule(v.kind, v.value),
      reason: v.reason,
    });
    if (!parsed.success) {
      this.failed.emit(firstIssue(parsed.error, 'σ_pt rule', 'check the value'));
      return;
    }
    this.failed.emit(null);
    this.added.emit(parsed.data);
  }
}
