import { ChangeDetectionStrategy, Component, input, output } from '@angular/core';
import { type FormControl, type FormGroup, ReactiveFormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';

/** One entry of the list under the form: what it says and the name of its remove button. */
export interface ListedEntry {
  readonly text: string;
  readonly removeLabel: string;
}

/**
 * A one-row form that adds an entry with its reason, and the entries so far, each with a button
 * to take it back. The fields before the reason are projected (bound with `[formControl]`); the
 * parent checks the value on `submitted` and keeps the list.
 */
@Component({
  selector: 'app-entry-list-form',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [
    ReactiveFormsModule,
    MatButtonModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
  ],
  // .form-row and .wide: the board's one-row forms
  template: `
    <h2>{{ heading() }}</h2>
    <form class="form-row" [formGroup]="form()" (ngSubmit)="submitted.emit()" novalidate>
      <ng-content />
      <mat-form-field appearance="outline" subscriptSizing="dynamic" class="wide">
        <mat-label>Reason</mat-label>
        <input matInput [formControl]="reason()" [attr.data-testid]="reasonTestId()" />
      </mat-form-field>
      <button mat-stroked-button type="submit" [attr.data-testid]="submitTestId()">
        {{ submitLabel() }}
      </button>
    </form>
    @for (entry of entries(); track $index) {
      <p>
        {{ entry.text }}
        <button
          mat-icon-button
          type="button"
          [attr.aria-label]="entry.removeLabel"
          (click)="removed.emit($index)"
        >
          <mat-icon>close</mat-icon>
        </button>
      </p>
    }
  `,
  styleUrl: '../board/board.scss',
})
export class EntryListForm {
  readonly heading = input.required<string>();
  /** The whole form (its submit); the projected fields bind its other controls. */
  readonly form = input.required<FormGroup>();
  readonly reason = input.required<FormControl<string>>();
  readonly reasonTestId = input.required<string>();
  readonly submitLabel = input.required<string>();
  readonly submitTestId = input.required<string>();
  readonly entries = input.required<readonly ListedEntry[]>();
  /** The submit button was pressed (or Enter in a field). */
  readonly submitted = output();
  /** The index of the entry to take back. */
  readonly removed = output<number>();
}
