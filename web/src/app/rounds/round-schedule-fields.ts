import { ChangeDetectionStrategy, Component, input } from '@angular/core';
import { type FormGroup, ReactiveFormsModule } from '@angular/forms';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { errorMessage } from '../core/zod-form-errors';

/** The round's three dates, shared by the new-round and edit-round dialogs. */
@Component({
  selector: 'app-round-schedule-fields',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [ReactiveFormsModule, MatFormFieldModule, MatInputModule],
  template: `
    <div class="row" [formGroup]="group()">
      <mat-form-field>
        <mat-label>Enrolment closes</mat-label>
        <input matInput type="date" formControlName="enrolmentClosesOn" />
        <mat-error>{{ errorOf('enrolmentClosesOn') }}</mat-error>
      </mat-form-field>
      <mat-form-field>
        <mat-label>Dispatch</mat-label>
        <input matInput type="date" formControlName="dispatchOn" />
        <mat-error>{{ errorOf('dispatchOn') }}</mat-error>
      </mat-form-field>
      <mat-form-field>
        <mat-label>Results due</mat-label>
        <input matInput type="datetime-local" formControlName="resultsDueAt" />
        <mat-error>{{ errorOf('resultsDueAt') }}</mat-error>
      </mat-form-field>
    </div>
  `,
  styles: `
    :host {
      display: block;
    }
    .row {
      display: flex;
      gap: 12px;
      flex-wrap: wrap;
    }
    .row mat-form-field {
      flex: 1 1 180px;
    }
  `,
})
export class RoundScheduleFields {
  /** A form group holding the controls enrolmentClosesOn, dispatchOn and resultsDueAt (strings). */
  readonly group = input.required<FormGroup>();

  protected errorOf(name: string): string {
    return errorMessage(this.group().get(name));
  }
}
