import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { NonNullableFormBuilder } from '@angular/forms';
import { MatSelectModule } from '@angular/material/select';
import { type Measurand, MeasurandInput, MeasurandUpdate } from '@ringlet/shared/contracts/rounds';
import { errorMessage } from '../../core/zod-form-errors';
import { FORM_DIALOG_IMPORTS } from '../../shared/dialog-actions';
import { dialogData, DialogSubmit } from '../../shared/dialog-submit';
import { pathMap } from '../../shared/form-submit';
import { numberOrNull } from '../../shared/form-values';
import {
  ASSIGNED_VALUE_KIND_LABELS,
  assignedRuleFromForm,
  assignedRuleToForm,
  sigmaRuleFromForm,
  sigmaRuleToForm,
} from '../measurand-rules';
import { RoundsService } from '../rounds-service';
import { sigmaStudyLink } from '../sigma-source-picker';
import { SigmaRuleFields } from './sigma-rule-fields';

export interface MeasurandDialogData {
  readonly roundId: string;
  readonly schemeId: string; // its finished precision studies can give σ_R
  /** The measurand to edit; absent to add one. */
  readonly measurand?: Measurand;
}

/** Add or edit one measurand with its σ_pt and assigned-value rules. Closes with true once saved. */
@Component({
  selector: 'app-measurand-dialog',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [FORM_DIALOG_IMPORTS, MatSelectModule, SigmaRuleFields],
  templateUrl: './measurand-dialog.html',
  styleUrl: './measurand-form.scss',
})
export class MeasurandDialog {
  protected readonly data = dialogData<MeasurandDialogData>();
  private readonly api = inject(RoundsService);
  private readonly fb = inject(NonNullableFormBuilder);
  protected readonly errorMessage = errorMessage;
  protected readonly assignedKinds = Object.entries(ASSIGNED_VALUE_KIND_LABELS);

  private readonly m = this.data.measurand;
  protected readonly form = this.fb.group({
    key: [this.m?.key ?? ''],
    name: [this.m?.name ?? ''],
    unit: [this.m?.unit ?? ''],
    decimals: [this.m?.decimals ?? (1 as number | null)],
    replicatesRequired: [this.m?.replicatesRequired ?? (3 as number | null)],
    // 12 participants minimum: common practice (see DLS_DEFAULT_MEASURANDS)
    minParticipants: [this.m?.minParticipants ?? (12 as number | null)],
    sigmaPtRule: this.fb.group(sigmaRuleToForm(this.m?.sigmaPtRule ?? { kind: 'robust-sd' })),
    assignedValueRule: this.fb.group(
      assignedRuleToForm(this.m?.assignedValueRule ?? { kind: 'consensus' }),
    ),
  });
  protected readonly assigned = this.form.controls.assignedValueRule;
  protected readonly link = sigmaStudyLink(
    this.form.controls.sigmaPtRule.controls.sigmaR,
    this.m?.sigmaPtRule,
  );
  /** Adding goes through the batch route, whose paths start with measurands.0. */
  protected readonly submission = new DialogSubmit<true>(this.form, {
    map: pathMap('measurands.0.'),
  });

  protected submit(): void {
    const raw = this.form.getRawValue();
    const candidate = {
      key: raw.key,
      name: raw.name,
      unit: raw.unit,
      decimals: numberOrNull(raw.decimals),
      replicatesRequired: numberOrNull(raw.replicatesRequired),
      minParticipants: numberOrNull(raw.minParticipants),
      sigmaPtRule: sigmaRuleFromForm(raw.sigmaPtRule, this.link.rule()),
      assignedValueRule: assignedRuleFromForm(raw.assignedValueRule),
    };
    const { roundId, measurand } = this.data;
    const saved = () => this.submission.close(true);
    if (measurand) {
      const update = (v: MeasurandUpdate) => this.api.updateMeasurand(roundId, measurand.id, v);
      this.submission.submit(MeasurandUpdate, candidate, update, saved);
    } else {
      const add = (v: MeasurandInput) => this.api.addMeasurands(roundId, [v]);
      this.submission.submit(MeasurandInput, candidate, add, saved);
    }
  }
}
