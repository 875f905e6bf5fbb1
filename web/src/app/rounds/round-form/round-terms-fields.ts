import { ChangeDetectionStrategy, Component, input } from '@angular/core';
import { type FormGroup, ReactiveFormsModule } from '@angular/forms';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { errorMessage } from '../../core/zod-form-errors';

/**
 * A round's title, three dates, fee, currency and protocol temperature: one field group shared by
 * the new-round and edit-round dialogs (controls from roundTermsControls).
 */
@Component({
  selector: 'app-round-terms-fields',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [ReactiveFormsModule, MatFormFieldModule, MatInputModule],
  templateUrl: './round-terms-fields.html',
  styleUrl: './round-form.scss',
  host: { class: 'form-stack' },
})
export class RoundTermsFields {
  /** The dialog's form group, holding the controls of roundTermsControls. */
  readonly group = input.required<FormGroup>();
  /** The fee can no longer change (enrolment has opened): says so under the fee. */
  readonly feeFixed = input(false);

  protected errorOf(name: string): string {
    return errorMessage(this.group().get(name));
  }
}
