import { ChangeDetectionStrategy, Component, input } from '@angular/core';
import { type FormControl, type FormGroup, ReactiveFormsModule } from '@angular/forms';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';
import { errorMessage } from '../../core/zod-form-errors';
import { SIGMA_PT_KIND_LABELS, type SigmaPtRuleForm } from '../measurand-rules';
import { SigmaSourcePicker, type sigmaStudyLink } from '../sigma-source-picker';

/** The controls of a σ_pt rule form group (measurand-rules.ts SigmaPtRuleForm). */
export type SigmaPtRuleControls = { [K in keyof SigmaPtRuleForm]: FormControl<SigmaPtRuleForm[K]> };

/**
 * A measurand's σ_pt rule: the kind and the fields it needs; for σ_R from a precision study, the
 * picker of the scheme's finished studies.
 */
@Component({
  selector: 'app-sigma-rule-fields',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [
    ReactiveFormsModule,
    MatFormFieldModule,
    MatInputModule,
    MatSelectModule,
    SigmaSourcePicker,
  ],
  templateUrl: './sigma-rule-fields.html',
  styleUrl: './measurand-form.scss',
})
export class SigmaRuleFields {
  readonly group = input.required<FormGroup<SigmaPtRuleControls>>();
  /** The measurand's unit, named in the value fields' labels. */
  readonly unit = input('');
  readonly schemeId = input.required<string>();
  /** The measurand's file code: the picker keeps that measurand's levels. */
  readonly measurandKey = input('');
  /** The replicates required: m of a σ_r taken from a study. */
  readonly replicates = input<number | null>(null);
  /** The study link of the rule (sigmaStudyLink on the group's sigmaR control). */
  readonly link = input.required<ReturnType<typeof sigmaStudyLink>>();
  protected readonly errorMessage = errorMessage;
  protected readonly kinds = Object.entries(SIGMA_PT_KIND_LABELS);
}
