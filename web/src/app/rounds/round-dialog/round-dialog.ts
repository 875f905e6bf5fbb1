import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { NonNullableFormBuilder } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatSelectModule } from '@angular/material/select';
import {
  DEFAULT_INSTRUCTIONS,
  ROUND_KIND_LABELS,
  RoundCreate,
  type RoundKind,
  type Scheme,
} from '@ringlet/shared/contracts/rounds';
import { errorMessage } from '../../core/zod-form-errors';
import { FORM_DIALOG_IMPORTS } from '../../shared/dialog-actions';
import { dialogData, DialogSubmit } from '../../shared/dialog-submit';
import { testItemFromForm, testItemGroup } from '../item-dialog/test-item-form';
import {
  NEW_ROUND_TERMS,
  ROUND_TERMS_PATHS,
  roundTermsControls,
  roundTermsFromForm,
} from '../round-form/round-terms';
import { RoundTermsFields } from '../round-form/round-terms-fields';
import { RoundsService } from '../rounds-service';

export interface RoundDialogData {
  readonly schemes: readonly Scheme[];
}

/** Create a round in draft, with its test items; the scheme's measurands come along. */
@Component({
  selector: 'app-round-dialog',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [FORM_DIALOG_IMPORTS, RoundTermsFields, MatSelectModule, MatButtonModule, MatIconModule],
  templateUrl: './round-dialog.html',
  styleUrls: ['../round-form/round-form.scss', './round-dialog.scss'],
})
export class RoundDialog {
  protected readonly data = dialogData<RoundDialogData>();
  private readonly api = inject(RoundsService);
  private readonly fb = inject(NonNullableFormBuilder);
  protected readonly errorMessage = errorMessage;
  protected readonly kindLabels = ROUND_KIND_LABELS;
  protected readonly form = this.fb.group({
    schemeId: [this.data.schemes[0]?.id ?? ''],
    code: [''],
    kind: ['pt' as RoundKind],
    ...roundTermsControls(this.fb, NEW_ROUND_TERMS),
    instructions: [DEFAULT_INSTRUCTIONS],
    items: this.fb.array([testItemGroup(this.fb)]),
  });
  protected readonly submission = new DialogSubmit<string>(this.form, { map: ROUND_TERMS_PATHS });

  protected addItem(): void {
    this.form.controls.items.push(testItemGroup(this.fb));
  }

  protected removeItem(i: number): void {
    this.form.controls.items.removeAt(i);
  }

  protected submit(): void {
    const raw = this.form.getRawValue();
    const candidate = {
      schemeId: raw.schemeId,
      code: raw.code,
      kind: raw.kind,
      ...roundTermsFromForm(raw),
      instructions: raw.instructions,
      items: raw.items.map(testItemFromForm),
    };
    const create = (v: RoundCreate) => this.api.createRound(v);
    this.submission.submit(RoundCreate, candidate, create, (r) => this.submission.close(r.id));
  }
}
