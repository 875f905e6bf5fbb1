import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { NonNullableFormBuilder, Validators } from '@angular/forms';
import { MatRadioModule } from '@angular/material/radio';
import { MatSelectModule } from '@angular/material/select';
import {
  PRECISION_EXCLUSION_KIND_LABELS,
  PRECISION_EXCLUSION_KINDS,
  PrecisionDecisionInput,
  type PrecisionDecision,
  type PrecisionExclusionKind,
} from '@ringlet/shared/contracts/precision';
import type * as z from 'zod';
import { errorMessage } from '../core/zod-form-errors';
import { FORM_DIALOG_IMPORTS } from '../shared/dialog-actions';
import { dialogData, DialogSubmit } from '../shared/dialog-submit';
import { ClassBadge } from './class-badge';
import { testNames, type PendingCell } from './precision-view';

export interface DecisionDialogData {
  readonly cell: PendingCell;
  /** The suspect replicate's value as shown (Cochran), for the scope choice. */
  readonly suspectValue: string | null;
}

/** What the dialog closes with: the decision as the contract parses it. */
export type DecisionResult = z.output<typeof PrecisionDecisionInput>;

/**
 * The coordinator's decision on a flagged cell: set it (or Cochran's suspect replicate) aside, or
 * keep it, always with a reason. Nothing is stored here; the page recomputes and then stores it.
 */
@Component({
  selector: 'app-precision-decision-dialog',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [FORM_DIALOG_IMPORTS, MatRadioModule, MatSelectModule, ClassBadge],
  templateUrl: './decision-dialog.html',
  styles: `
    .choices {
      display: flex;
      flex-direction: column;
      margin: 4px 0 12px;
    }
  `,
})
export class DecisionDialog {
  protected readonly data = dialogData<DecisionDialogData>();
  protected readonly errorMessage = errorMessage;
  protected readonly kinds = PRECISION_EXCLUSION_KINDS.map((k) => ({
    value: k,
    label: PRECISION_EXCLUSION_KIND_LABELS[k],
  }));
  protected readonly tests = testNames(this.data.cell.tests);
  protected readonly form = inject(NonNullableFormBuilder).group({
    decision: ['confirmed' as PrecisionDecision],
    scope: ['cell' as 'cell' | 'replicate'],
    kind: [this.data.cell.classification as PrecisionExclusionKind],
    reason: ['', Validators.required],
  });
  protected readonly submit = new DialogSubmit<DecisionResult>(this.form);

  protected save(): void {
    const v = this.form.getRawValue();
    const c = this.data.cell;
    const value = this.submit.parse(PrecisionDecisionInput, {
      itemCode: c.itemCode,
      measurandKey: c.measurandKey,
      participantCode: c.participantCode,
      replicate: v.scope === 'replicate' ? c.suspectReplicate : null,
      kind: v.kind,
      decision: v.decision,
      reason: v.reason,
    });
    if (value) this.submit.close(value);
  }
}
