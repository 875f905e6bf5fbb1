import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { NonNullableFormBuilder } from '@angular/forms';
import { type TestItem, TestItemInput, TestItemUpdate } from '@ringlet/shared/contracts/rounds';
import { errorMessage } from '../../core/zod-form-errors';
import { FORM_DIALOG_IMPORTS } from '../../shared/dialog-actions';
import { dialogData, DialogSubmit } from '../../shared/dialog-submit';
import { pathMap } from '../../shared/form-submit';
import { RoundsService } from '../rounds-service';
import { testItemFromForm, testItemGroup } from './test-item-form';

export interface ItemDialogData {
  readonly roundId: string;
  /** The item to edit; absent to add one. */
  readonly item?: TestItem;
}

/** Add or edit one test item of a round (draft or enrolling). Closes with true once saved. */
@Component({
  selector: 'app-item-dialog',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [FORM_DIALOG_IMPORTS],
  templateUrl: './item-dialog.html',
  styleUrl: '../round-form/round-form.scss',
})
export class ItemDialog {
  protected readonly data = dialogData<ItemDialogData>();
  private readonly api = inject(RoundsService);
  protected readonly errorMessage = errorMessage;
  protected readonly form = testItemGroup(inject(NonNullableFormBuilder), this.data.item);
  /** Adding goes through the batch route, whose paths start with items.0. */
  protected readonly submission = new DialogSubmit<true>(this.form, { map: pathMap('items.0.') });

  protected submit(): void {
    const candidate = testItemFromForm(this.form.getRawValue());
    const { roundId, item } = this.data;
    const saved = () => this.submission.close(true);
    if (item) {
      this.submission.submit(
        TestItemUpdate,
        candidate,
        (v) => this.api.updateItem(roundId, item.id, v),
        saved,
      );
    } else {
      this.submission.submit(
        TestItemInput,
        candidate,
        (v) => this.api.addItems(roundId, [v]),
        saved,
      );
    }
  }
}
