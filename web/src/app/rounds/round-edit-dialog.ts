import { ChangeDetectionStrategy, Component, inject, signal } from '@angular/core';
import { formatDate } from '@angular/common';
import { NonNullableFormBuilder, ReactiveFormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MAT_DIALOG_DATA, MatDialogModule, MatDialogRef } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import {
  isFeeOpen,
  type RoundDetail,
  RoundUpdate,
  SAFETY_CAUTIONS,
} from '@ringlet/shared/contracts/rounds';
import { SAFETY_BLOCK, withoutSafetyBlock } from '@ringlet/shared/contracts/safety';
import { errorMessage } from '../core/zod-form-errors';
import { parseWith, pathMap, showServerError } from './form-errors';
import { localToIso } from './round-dialog';
import { RoundScheduleFields } from './round-schedule-fields';
import { RoundsService } from './rounds-service';

/** ISO 8601 → the value a datetime-local input shows, in the user's time zone ("2026-06-30T14:00"). */
export function isoToLocal(iso: string | null): string {
  if (!iso) return '';
  const d = new Date(iso);
  if (Number.isNaN(d.getTime())) return '';
  // A fixed pattern, not a locale's: the input wants exactly this form.
  return formatDate(d, "yyyy-MM-dd'T'HH:mm", 'en-US');
}

/**
 * The instructions as stored: the standard safety block first (it cannot be removed; the server
 * adds it too), then the coordinator's text, which may add further cautions.
 */
export function composeInstructions(body: string): string {
  const text = body.trim();
  return text ? `${SAFETY_BLOCK}\n\n${text}` : SAFETY_BLOCK;
}

/** Only the fields that differ from the round (so the audit trail records what changed). */
export function changedFields(
  round: RoundDetail,
  next: Required<RoundUpdate>,
): Partial<RoundUpdate> {
  const out: Partial<Record<keyof RoundUpdate, unknown>> = {};
  for (const key of Object.keys(next) as (keyof RoundUpdate)[]) {
    const before =
      key === 'resultsDueAt' && round.resultsDueAt
        ? new Date(round.resultsDueAt).toISOString()
        : round[key];
    if (next[key] !== before) out[key] = next[key];
  }
  return out as Partial<RoundUpdate>;
}

/** Edit a round's title, dates, protocol temperature, fee and instructions (PATCH /rounds/{id}). */
@Component({
  selector: 'app-round-edit-dialog',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [
    ReactiveFormsModule,
    RoundScheduleFields,
    MatDialogModule,
    MatFormFieldModule,
    MatInputModule,
    MatButtonModule,
  ],
  template: `
    <h2 mat-dialog-title>Edit round {{ round.code }}</h2>
    <form [formGroup]="form" (ngSubmit)="submit()" novalidate>
      <mat-dialog-content class="form-stack">
        <mat-form-field>
          <mat-label>Title</mat-label>
          <input matInput formControlName="title" />
          <mat-error>{{ errorMessage(form.controls.title) }}</mat-error>
        </mat-form-field>
        <app-round-schedule-fields [group]="form" />
        <div class="row">
          <mat-form-field>
            <mat-label>Protocol temperature (°C)</mat-label>
            <input matInput type="number" step="0.1" formControlName="protocolTemperatureC" />
            <mat-error>{{ errorMessage(form.controls.protocolTemperatureC) }}</mat-error>
          </mat-form-field>
          <mat-form-field>
            <mat-label>Participation fee</mat-label>
            <input matInput type="number" min="0" step="0.01" formControlName="fee" />
            @if (!feeOpen) {
              <mat-hint>Fixed once enrolment has opened.</mat-hint>
            }
            <mat-error>{{ errorMessage(form.controls.fee) }}</mat-error>
          </mat-form-field>
          <mat-form-field>
            <mat-label>Currency</mat-label>
            <input matInput formControlName="currency" maxlength="3" />
            <mat-error>{{ errorMessage(form.controls.currency) }}</mat-error>
          </mat-form-field>
        </div>
        <p class="cautions-head">
          Every round's instructions open with these safety cautions (they cannot be removed; add
          your own below):
        </p>
        <ul
          class="cautions"
          aria-label="Safety cautions shown to labs"
          data-testid="fixed-cautions"
        >
          @for (c of cautions; track c) {
            <li>{{ c }}</li>
          }
        </ul>
        <mat-form-field>
          <mat-label
            >Instructions for labs (after the cautions; add further cautions here)</mat-label
          >
          <textarea matInput formControlName="instructions" rows="7" class="plain"></textarea>
          <mat-hint>Plain text: line breaks and "- " lists show as written.</mat-hint>
          <mat-error>{{ errorMessage(form.controls.instructions) }}</mat-error>
        </mat-form-field>
        @if (failure(); as message) {
          <p class="form-error" role="alert">{{ message }}</p>
        }
      </mat-dialog-content>
      <mat-dialog-actions align="end">
        <button mat-button type="button" mat-dialog-close>Cancel</button>
        <button mat-flat-button type="submit" [disabled]="busy()" data-testid="save-round">
          Save changes
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
      flex: 1 1 180px;
    }
    .cautions-head {
      margin: 4px 0 0;
      font-size: 0.9em;
    }
    .cautions {
      margin: 0 0 8px;
      padding-left: 20px;
      font-size: 0.9em;
    }
    .plain {
      white-space: pre-wrap;
    }
  `,
})
export class RoundEditDialog {
  protected readonly round = inject<RoundDetail>(MAT_DIALOG_DATA);
  private readonly api = inject(RoundsService);
  private readonly ref = inject<MatDialogRef<RoundEditDialog, RoundDetail>>(MatDialogRef);
  protected readonly errorMessage = errorMessage;
  protected readonly cautions = SAFETY_CAUTIONS;
  protected readonly feeOpen = isFeeOpen(this.round.state);
  protected readonly busy = signal(false);
  protected readonly failure = signal<string | null>(null);
  protected readonly form = inject(NonNullableFormBuilder).group({
    title: [this.round.title],
    enrolmentClosesOn: [this.round.enrolmentClosesOn ?? ''],
    dispatchOn: [this.round.dispatchOn ?? ''],
    resultsDueAt: [isoToLocal(this.round.resultsDueAt)],
    protocolTemperatureC: [this.round.protocolTemperatureC as number | null],
    fee: [{ value: (this.round.feeMinor / 100) as number | null, disabled: !this.feeOpen }],
    currency: [{ value: this.round.currency, disabled: !this.feeOpen }],
    instructions: [withoutSafetyBlock(this.round.instructions)],
  });

  /** The fee is typed in major units; the contract's feeMinor errors belong under it. */
  private readonly paths = pathMap('', { feeMinor: 'fee' });

  protected submit(): void {
    const raw = this.form.getRawValue();
    const candidate = {
      title: raw.title,
      enrolmentClosesOn: raw.enrolmentClosesOn || null,
      dispatchOn: raw.dispatchOn || null,
      resultsDueAt: localToIso(raw.resultsDueAt),
      protocolTemperatureC:
        raw.protocolTemperatureC === null || (raw.protocolTemperatureC as unknown) === ''
          ? null
          : Number(raw.protocolTemperatureC),
      feeMinor:
        raw.fee === null || (raw.fee as unknown) === '' ? null : Math.round(Number(raw.fee) * 100),
      currency: raw.currency.trim().toUpperCase(),
      instructions: composeInstructions(raw.instructions),
    };
    const value = parseWith(this.form, RoundUpdate, candidate, this.failure, this.paths);
    if (!value) return;
    const changes = changedFields(this.round, value as Required<RoundUpdate>);
    if (!Object.keys(changes).length) {
      this.ref.close();
      return;
    }
    this.busy.set(true);
    this.api.updateRound(this.round.id, changes).subscribe({
      next: (r) => this.ref.close(r),
      error: (e: unknown) => {
        this.busy.set(false);
        showServerError(this.form, e, this.failure, this.paths);
      },
    });
  }
}
