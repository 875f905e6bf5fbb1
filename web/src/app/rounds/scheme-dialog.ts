import { ChangeDetectionStrategy, Component, inject, signal } from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatDialogModule, MatDialogRef } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import {
  DLS_DEFAULT_MEASURANDS,
  type Scheme,
  SchemeCreate,
} from '@ringlet/shared/contracts/rounds';
import { errorMessage } from '../core/zod-form-errors';
import { parseWith, showServerError } from './form-errors';
import { RoundsService } from './rounds-service';

/** Create a PT scheme; new schemes measure the DLS defaults (Z-average and PDI). */
@Component({
  selector: 'app-scheme-dialog',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [
    ReactiveFormsModule,
    MatDialogModule,
    MatFormFieldModule,
    MatInputModule,
    MatButtonModule,
  ],
  template: `
    <h2 mat-dialog-title>New scheme</h2>
    <form [formGroup]="form" (ngSubmit)="submit()" novalidate>
      <mat-dialog-content class="form-stack">
        <mat-form-field>
          <mat-label>Code</mat-label>
          <input matInput formControlName="code" placeholder="NANO-DLS" />
          <mat-error>{{ errorMessage(form.controls.code) }}</mat-error>
        </mat-form-field>
        <mat-form-field>
          <mat-label>Name</mat-label>
          <input matInput formControlName="name" />
          <mat-error>{{ errorMessage(form.controls.name) }}</mat-error>
        </mat-form-field>
        <mat-form-field>
          <mat-label>Description</mat-label>
          <textarea matInput formControlName="description" rows="3"></textarea>
        </mat-form-field>
        <mat-form-field>
          <mat-label>Rules (participation, confidentiality, scoring)</mat-label>
          <textarea matInput formControlName="rules" rows="3"></textarea>
        </mat-form-field>
        <p>
          Default measurands:
          @for (m of defaults; track m.key) {
            <span class="chip"
              >{{ m.name }}{{ m.unit ? ' (' + m.unit + ')' : '' }}, {{ m.decimals }} decimals,
              {{ m.replicatesRequired }} replicates</span
            >
          }
        </p>
        @if (failure(); as message) {
          <p class="form-error" role="alert">{{ message }}</p>
        }
      </mat-dialog-content>
      <mat-dialog-actions align="end">
        <button mat-button type="button" mat-dialog-close>Cancel</button>
        <button mat-flat-button type="submit" [disabled]="busy()">Create scheme</button>
      </mat-dialog-actions>
    </form>
  `,
  styles: `
    .chip {
      display: block;
      margin-left: 12px;
    }
  `,
})
export class SchemeDialog {
  private readonly api = inject(RoundsService);
  private readonly ref = inject<MatDialogRef<SchemeDialog, Scheme>>(MatDialogRef);
  protected readonly errorMessage = errorMessage;
  protected readonly defaults = DLS_DEFAULT_MEASURANDS;
  protected readonly busy = signal(false);
  protected readonly failure = signal<string | null>(null);
  protected readonly form = inject(NonNullableFormBuilder).group({
    code: [''],
    name: [''],
    description: [''],
    rules: [''],
  });

  protected submit(): void {
    const value = parseWith(this.form, SchemeCreate, this.form.getRawValue(), this.failure);
    if (!value) return;
    this.busy.set(true);
    this.api.createScheme(value).subscribe({
      next: (s) => this.ref.close(s),
      error: (e: unknown) => {
        this.busy.set(false);
        showServerError(this.form, e, this.failure);
      },
    });
  }
}
