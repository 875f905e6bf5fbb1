import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { NonNullableFormBuilder } from '@angular/forms';
import {
  isFeeOpen,
  type RoundDetail,
  RoundUpdate,
  SAFETY_CAUTIONS,
} from '@ringlet/shared/contracts/rounds';
import { withoutSafetyBlock } from '@ringlet/shared/contracts/safety';
import { errorMessage } from '../../core/zod-form-errors';
import { FORM_DIALOG_IMPORTS } from '../../shared/dialog-actions';
import { dialogData, DialogSubmit } from '../../shared/dialog-submit';
import {
  changedFields,
  composeInstructions,
  ROUND_TERMS_PATHS,
  roundTermsControls,
  roundTermsFromForm,
  roundTermsOf,
} from '../round-form/round-terms';
import { RoundTermsFields } from '../round-form/round-terms-fields';
import { RoundsService } from '../rounds-service';

/** Edit a round's title, dates, protocol temperature, fee and instructions (PATCH /rounds/{id}). */
@Component({
  selector: 'app-round-edit-dialog',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [FORM_DIALOG_IMPORTS, RoundTermsFields],
  templateUrl: './round-edit-dialog.html',
  styles: `
    .cautions-head {
      margin: 4px 0 0;
      font-size: 0.9em;
    }
    .cautions {
      margin: 0 0 8px;
      padding-left: 20px;
      font-size: 0.9em;
    }
    .plain {
      white-space: pre-wrap;
    }
  `,
})
export class RoundEditDialog {
  protected readonly round = dialogData<RoundDetail>();
  private readonly api = inject(RoundsService);
  private readonly fb = inject(NonNullableFormBuilder);
  protected readonly errorMessage = errorMessage;
  protected readonly cautions = SAFETY_CAUTIONS;
  protected readonly feeOpen = isFeeOpen(this.round.state);
  protected readonly form = this.fb.group({
    ...roundTermsControls(this.fb, roundTermsOf(this.round), this.feeOpen),
    instructions: [withoutSafetyBlock(this.round.instructions)],
  });
  protected readonly submission = new DialogSubmit<RoundDetail>(this.form, {
    map: ROUND_TERMS_PATHS,
  });

  protected submit(): void {
    const raw = this.form.getRawValue();
    const value = this.submission.parse(RoundUpdate, {
      ...roundTermsFromForm(raw),
      instructions: composeInstructions(raw.instructions),
    });
    if (!value) return;
    const changes = changedFields(this.round, value as Required<RoundUpdate>);
    if (!Object.keys(changes).length) {
      this.submission.close();
      return;
    }
    this.submission.runAndClose(this.api.updateRound(this.round.id, changes));
  }
}
