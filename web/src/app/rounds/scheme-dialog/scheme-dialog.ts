import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { NonNullableFormBuilder } from '@angular/forms';
import {
  DLS_DEFAULT_MEASURANDS,
  type Scheme,
  SchemeCreate,
} from '@ringlet/shared/contracts/rounds';
import { errorMessage } from '../../core/zod-form-errors';
import { FORM_DIALOG_IMPORTS } from '../../shared/dialog-actions';
import { DialogSubmit } from '../../shared/dialog-submit';
import { RoundsService } from '../rounds-service';

/** Create a PT scheme; new schemes measure the DLS defaults (Z-average and PDI). */
@Component({
  selector: 'app-scheme-dialog',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [FORM_DIALOG_IMPORTS],
  templateUrl: './scheme-dialog.html',
  styles: `
    .chip {
      display: block;
      margin-left: 12px;
    }
  `,
})
export class SchemeDialog {
  private readonly api = inject(RoundsService);
  protected readonly errorMessage = errorMessage;
  protected readonly defaults = DLS_DEFAULT_MEASURANDS;
  protected readonly form = inject(NonNullableFormBuilder).group({
    code: [''],
    name: [''],
    description: [''],
    rules: [''],
  });
  protected readonly submission = new DialogSubmit<Scheme>(this.form);

  protected submit(): void {
    const create = (v: SchemeCreate) => this.api.createScheme(v);
    this.submission.submitAndClose(SchemeCreate, this.form.getRawValue(), create);
  }
}
