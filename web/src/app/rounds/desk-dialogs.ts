import { ChangeDetectionStrategy, Component, inject, signal } from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatCheckboxModule } from '@angular/material/checkbox';
import { MAT_DIALOG_DATA, MatDialogModule, MatDialogRef } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';
import type { Observable } from 'rxjs';
import {
  DispatchInput,
  ExtensionGrant,
  HOMOGENEITY_DECISION_LABELS,
  HomogeneityDecisionKind,
  StudyDecision,
  TransitionRequest,
  Withdrawal,
} from '@ringlet/shared/contracts/rounds';
import { ROUND_STATE_LABELS, type RoundState } from '@ringlet/shared/contracts/round-states';
import type * as z from 'zod';
import { errorMessage } from '../core/zod-form-errors';
import { parseWith, showServerError } from './form-errors';
import { localToIso } from './round-dialog';

/** What a desk dialog asks for; `send` performs the call with the parsed value. */
export interface DeskDialogData<T> {
  readonly kind: 'transition' | 'withdrawal' | 'extension' | 'dispatch' | 'decision' | 'confirm';
  /** For 'confirm': the button's label (e.g. "Remove item C"). */
  readonly confirmLabel?: string;
  readonly title: string;
  readonly intro?: string;
  /** For a transition: the target state and whether the move may close early (before results are due). */
  readonly to?: RoundState;
  readonly offerForce?: boolean;
  /** For a transition: the button text (docs/GLOSSARY.md names moves back for what they do). */
  readonly moveLabel?: string;
  /** For a transition: who hears of the move. */
  readonly whoIsTold?: string;
  /** Cautions to show (e.g. packing and transport for a dispatch). */
  readonly cautions?: readonly string[];
  readonly reasonRequired?: boolean;
  readonly send: (value: never) => Observable<T>;
}

const DECISION_LABELS: Record<z.infer<typeof HomogeneityDecisionKind>, string> = {
  ...HOMOGENEITY_DECISION_LABELS,
  accept: `${HOMOGENEITY_DECISION_LABELS.accept} (state why)`,
};

/** One dialog for the Round desk's small actions: transitions, withdrawal, extension, dispatch, decision, confirming a removal. */
@Component({
  selector: 'app-desk-dialog',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [
    ReactiveFormsModule,
    MatDialogModule,
    MatFormFieldModule,
    MatInputModule,
    MatSelectModule,
    MatCheckboxModule,
    MatButtonModule,
  ],
  template: `
    <h2 mat-dialog-title>{{ data.title }}</h2>
    <form [formGroup]="form" (ngSubmit)="submit()" novalidate>
      <mat-dialog-content class="form-stack">
        @if (data.intro) {
          <p>{{ data.intro }}</p>
        }
        @if (data.whoIsTold) {
          <p data-testid="who-is-told"><strong>Who is told:</strong> {{ data.whoIsTold }}</p>
        }
        @if (data.cautions?.length) {
          <div class="cautions" role="note" data-testid="dialog-cautions">
            <strong>Safety</strong>
            <ul>
              @for (c of data.cautions; track c) {
                <li>{{ c }}</li>
              }
            </ul>
          </div>
        }
        @if (data.kind === 'dispatch') {
          <mat-form-field
            ><mat-label>Courier</mat-label><input matInput formControlName="courier" />
            <mat-error>{{ errorMessage(form.controls.courier) }}</mat-error></mat-form-field
          >
          <mat-form-field
            ><mat-label>Tracking number</mat-label
            ><input matInput formControlName="trackingNumber" />
            <mat-error>{{ errorMessage(form.controls.trackingNumber) }}</mat-error></mat-form-field
          >
          <mat-form-field
            ><mat-label>Dispatched on</mat-label
            ><input matInput type="date" formControlName="dispatchedOn" />
            <mat-error>{{ errorMessage(form.controls.dispatchedOn) }}</mat-error></mat-form-field
          >
        }
        @if (data.kind === 'extension') {
          <mat-form-field
            ><mat-label>New deadline</mat-label
            ><input matInput type="datetime-local" formControlName="until" />
            <mat-error>{{ errorMessage(form.controls.until) }}</mat-error></mat-form-field
          >
        }
        @if (data.kind === 'decision') {
          <mat-form-field
            ><mat-label>Decision</mat-label>
            <mat-select formControlName="decision">
              @for (d of decisions; track d[0]) {
                <mat-option [value]="d[0]">{{ d[1] }}</mat-option>
              }
            </mat-select>
            <mat-error>{{ errorMessage(form.controls.decision) }}</mat-error></mat-form-field
          >
        }
        @if (data.kind !== 'dispatch' && data.kind !== 'confirm') {
          <mat-form-field>
            <mat-label
              >Reason{{
                data.reasonRequired || data.kind !== 'transition' ? '' : ' (optional)'
              }}</mat-label
            >
            <textarea matInput formControlName="reason" rows="3"></textarea>
            <mat-error>{{ errorMessage(form.controls.reason) }}</mat-error>
          </mat-form-field>
        }
        @if (data.offerForce) {
          <mat-checkbox formControlName="force"
            >Close early, before results are due (the reason is recorded)</mat-checkbox
          >
        }
        @if (failure(); as message) {
          <p class="form-error" role="alert">{{ message }}</p>
        }
      </mat-dialog-content>
      <mat-dialog-actions align="end">
        <button mat-button type="button" mat-dialog-close>Cancel</button>
        <button mat-flat-button type="submit" [disabled]="busy()" data-testid="dialog-confirm">
          {{ confirmLabel }}
        </button>
      </mat-dialog-actions>
    </form>
  `,
})
export class DeskDialog<T> {
  protected readonly data = inject<DeskDialogData<T>>(MAT_DIALOG_DATA);
  private readonly ref = inject<MatDialogRef<DeskDialog<T>, T>>(MatDialogRef);
  protected readonly errorMessage = errorMessage;
  protected readonly busy = signal(false);
  protected readonly failure = signal<string | null>(null);
  protected readonly decisions = Object.entries(DECISION_LABELS);
  protected readonly confirmLabel =
    this.data.kind === 'transition' && this.data.to
      ? (this.data.moveLabel ?? `Move to ${ROUND_STATE_LABELS[this.data.to]}`)
      : (this.data.confirmLabel ?? 'Confirm');
  protected readonly form = inject(NonNullableFormBuilder).group({
    reason: [''],
    force: [false],
    courier: [''],
    trackingNumber: [''],
    dispatchedOn: [new Date().toISOString().slice(0, 10)],
    until: [''],
    decision: ['widen-sigma-pt'],
  });

  private parsed(): unknown {
    const v = this.form.getRawValue();
    const reason = v.reason.trim() || undefined;
    switch (this.data.kind) {
      case 'transition':
        return parseWith(
          this.form,
          TransitionRequest,
          { to: this.data.to, reason, force: v.force },
          this.failure,
        );
      case 'withdrawal':
        return parseWith(this.form, Withdrawal, { reason: v.reason }, this.failure);
      case 'extension':
        return parseWith(
          this.form,
          ExtensionGrant,
          { until: localToIso(v.until) ?? '', reason: v.reason },
          this.failure,
        );
      case 'dispatch':
        return parseWith(
          this.form,
          DispatchInput,
          { courier: v.courier, trackingNumber: v.trackingNumber, dispatchedOn: v.dispatchedOn },
          this.failure,
        );
      case 'decision':
        return parseWith(
          this.form,
          StudyDecision,
          { decision: v.decision, reason: v.reason },
          this.failure,
        );
      case 'confirm':
        return {};
    }
  }

  protected submit(): void {
    const value = this.parsed();
    if (!value) return;
    this.busy.set(true);
    this.data.send(value as never).subscribe({
      next: (result) => this.ref.close(result),
      error: (e: unknown) => {
        this.busy.set(false);
        showServerError(this.form, e, this.failure);
      },
    });
  }
}
