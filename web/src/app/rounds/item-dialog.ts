import { ChangeDetectionStrategy, Component, inject, signal } from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MAT_DIALOG_DATA, MatDialogModule, MatDialogRef } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import type { Observable } from 'rxjs';
import { type TestItem, TestItemInput, TestItemUpdate } from '@ringlet/shared/contracts/rounds';
import { errorMessage } from '../core/zod-form-errors';
import { parseWith, pathMap, showServerError } from './form-errors';
import { RoundsService } from './rounds-service';

export interface ItemDialogData {
  readonly roundId: string;
  /** The item to edit; absent to add one. */
  readonly item?: TestItem;
}

/** Add or edit one test item of a round (draft or enrolling). Closes with true once saved. */
@Component({
  selector: 'app-item-dialog',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [
    ReactiveFormsModule,
    MatDialogModule,
    MatFormFieldModule,
    MatInputModule,
    MatButtonModule,
  ],
  template: `
    <h2 mat-dialog-title>
      {{ data.item ? 'Edit test item ' + data.item.code : 'Add a test item' }}
    </h2>
    <form [formGroup]="form" (ngSubmit)="submit()" novalidate>
      <mat-dialog-content class="form-stack">
        <div class="row">
          <mat-form-field class="code">
            <mat-label>Item code</mat-label>
            <input matInput formControlName="code" />
            <mat-error>{{ errorMessage(form.controls.code) }}</mat-error>
          </mat-form-field>
          <mat-form-field>
            <mat-label>Nominal size (nm)</mat-label>
            <input matInput type="number" min="0" formControlName="nominalSizeNm" />
            <mat-error>{{ errorMessage(form.controls.nominalSizeNm) }}</mat-error>
          </mat-form-field>
        </div>
        <mat-form-field>
          <mat-label>Material</mat-label>
          <input matInput formControlName="material" />
          <mat-error>{{ errorMessage(form.controls.material) }}</mat-error>
        </mat-form-field>
        <mat-form-field>
          <mat-label>Storage notes</mat-label>
          <textarea matInput formControlName="storageNotes" rows="2"></textarea>
          <mat-error>{{ errorMessage(form.controls.storageNotes) }}</mat-error>
        </mat-form-field>
        <mat-form-field>
          <mat-label>Handling notes</mat-label>
          <textarea matInput formControlName="handlingNotes" rows="2"></textarea>
          <mat-hint>Labs also see the standard safety cautions with every item.</mat-hint>
          <mat-error>{{ errorMessage(form.controls.handlingNotes) }}</mat-error>
        </mat-form-field>
        @if (failure(); as message) {
          <p class="form-error" role="alert">{{ message }}</p>
        }
      </mat-dialog-content>
      <mat-dialog-actions align="end">
        <button mat-button type="button" mat-dialog-close>Cancel</button>
        <button mat-flat-button type="submit" [disabled]="busy()" data-testid="save-item">
          {{ data.item ? 'Save item' : 'Add item' }}
        </button>
      </mat-dialog-actions>
    </form>
  `,
  styles: `
    .row {
      display: flex;
      gap: 12px;
      flex-wrap: wrap;
    }
    .row mat-form-field {
      flex: 1 1 160px;
    }
  `,
})
export class ItemDialog {
  protected readonly data = inject<ItemDialogData>(MAT_DIALOG_DATA);
  private readonly api = inject(RoundsService);
  private readonly ref = inject<MatDialogRef<ItemDialog, true>>(MatDialogRef);
  protected readonly errorMessage = errorMessage;
  protected readonly busy = signal(false);
  protected readonly failure = signal<string | null>(null);
  protected readonly form = inject(NonNullableFormBuilder).group({
    code: [this.data.item?.code ?? ''],
    material: [this.data.item?.material ?? ''],
    nominalSizeNm: [this.data.item?.nominalSizeNm ?? (null as number | null)],
    storageNotes: [this.data.item?.storageNotes ?? ''],
    handlingNotes: [this.data.item?.handlingNotes ?? ''],
  });
  /** Adding goes through the batch route, whose paths start with items.0. */
  private readonly paths = pathMap('items.0.');

  protected submit(): void {
    const raw = this.form.getRawValue();
    const candidate = {
      ...raw,
      nominalSizeNm:
        raw.nominalSizeNm === null || (raw.nominalSizeNm as unknown) === ''
          ? null
          : Number(raw.nominalSizeNm),
    };
    const item = this.data.item;
    let call: Observable<unknown>;
    if (item) {
      const value = parseWith(this.form, TestItemUpdate, candidate, this.failure);
      if (!value) return;
      call = this.api.updateItem(this.data.roundId, item.id, value);
    } else {
      const value = parseWith(this.form, TestItemInput, candidate, this.failure);
      if (!value) return;
      call = this.api.addItems(this.data.roundId, [value]);
    }
    this.busy.set(true);
    call.subscribe({
      next: () => this.ref.close(true),
      error: (e: unknown) => {
        this.busy.set(false);
        showServerError(this.form, e, this.failure, this.paths);
      },
    });
  }
}
