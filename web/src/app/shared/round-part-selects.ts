import { ChangeDetectionStrategy, Component, effect, input } from '@angular/core';
import { type FormControl, ReactiveFormsModule } from '@angular/forms';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatSelectModule } from '@angular/material/select';

/** What a measurand select shows of a round's measurands. */
export interface MeasurandChoice {
  readonly id: string;
  readonly key: string;
  readonly name: string;
}

/** What an item select shows of a round's test items. */
export interface ItemChoice {
  readonly id: string;
  readonly code: string;
}

/** A measurand's name by its key (the key itself when the round has no such measurand). */
export function measurandName(measurands: readonly MeasurandChoice[], key: string): string {
  return measurands.find((m) => m.key === key)?.name ?? key;
}

/** The "Measurand" select of a round's one-row forms (value: the key); picks the first while empty. */
@Component({
  selector: 'app-measurand-select',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [ReactiveFormsModule, MatFormFieldModule, MatSelectModule],
  host: { style: 'display: contents' },
  template: `
    <mat-form-field appearance="outline" subscriptSizing="dynamic">
      <mat-label>Measurand</mat-label>
      <mat-select [formControl]="control()" [attr.data-testid]="testId() || null">
        @for (m of measurands(); track m.id) {
          <mat-option [value]="m.key">{{ m.name }}</mat-option>
        }
      </mat-select>
    </mat-form-field>
  `,
})
export class MeasurandSelect {
  readonly control = input.required<FormControl<string>>();
  readonly measurands = input.required<readonly MeasurandChoice[]>();
  readonly testId = input('');

  constructor() {
    effect(() => {
      const first = this.measurands()[0];
      if (!this.control().value && first) this.control().setValue(first.key);
    });
  }
}

/**
 * The "Item" select of a round's one-row forms (value: the item code). With `everyItem` it offers
 * "Every item" (null) first; without, it picks the first item while empty.
 */
@Component({
  selector: 'app-item-select',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [ReactiveFormsModule, MatFormFieldModule, MatSelectModule],
  host: { style: 'display: contents' },
  template: `
    <mat-form-field appearance="outline" subscriptSizing="dynamic">
      <mat-label>Item</mat-label>
      <mat-select [formControl]="control()" [attr.data-testid]="testId() || null">
        @if (everyItem()) {
          <mat-option [value]="null">Every item</mat-option>
        }
        @for (i of items(); track i.id) {
          <mat-option [value]="i.code">{{ i.code }}</mat-option>
        }
      </mat-select>
    </mat-form-field>
  `,
})
export class ItemSelect {
  readonly control = input.required<FormControl<string | null>>();
  readonly items = input.required<readonly ItemChoice[]>();
  readonly everyItem = input(false);
  readonly testId = input('');

  constructor() {
    effect(() => {
      const first = this.items()[0];
      if (!this.everyItem() && !this.control().value && first) this.control().setValue(first.code);
    });
  }
}
