import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatDialogModule } from '@angular/material/dialog';
import type { PrecisionAnalysis } from '@ringlet/shared/contracts/precision';
import { problemMessage, problemOf } from '../core/problem';
import { dialogData, DialogSubmit } from '../shared/dialog-submit';
import { PrecisionService } from './precision-service';

export interface FinishDialogData {
  readonly roundId: string;
}

/** Plain words for a refused finish; "Decide every flag first" with the count when given. */
export function finishRefusal(error: unknown): string {
  const p = problemOf(error);
  if (p?.code !== 'undecided_flags') return problemMessage(error);
  const details: unknown = p.details;
  const pending =
    details && typeof details === 'object' && 'pending' in details ? details.pending : null;
  const n = Array.isArray(pending) ? pending.length : null;
  if (n === null) return 'Decide every flag first.';
  return `Decide every flag first: ${n} ${n === 1 ? 'flag has' : 'flags have'} no decision yet.`;
}

/**
 * Confirms "Finish the study" (Closed → Evaluated); closes with the server's analysis. A refusal
 * (flags still open) stays in the dialog, in plain words, next to the button.
 */
@Component({
  selector: 'app-precision-finish-dialog',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatDialogModule, MatButtonModule],
  template: `
    <h2 mat-dialog-title>Finish the study</h2>
    <mat-dialog-content>
      <p>
        The round becomes Evaluated: decisions and reference values can no longer change, and its
        s_R can be picked as σ_pt in a later PT round of the scheme.
      </p>
      @if (submit.failure(); as message) {
        <p class="form-error" role="alert" data-testid="finish-error">{{ message }}</p>
      }
    </mat-dialog-content>
    <mat-dialog-actions align="end">
      <button mat-button type="button" mat-dialog-close>Cancel</button>
      <button
        mat-flat-button
        type="button"
        [disabled]="submit.busy()"
        (click)="finish()"
        data-testid="finish-confirm"
      >
        Finish the study
      </button>
    </mat-dialog-actions>
  `,
})
export class FinishDialog {
  private readonly data = dialogData<FinishDialogData>();
  private readonly service = inject(PrecisionService);
  protected readonly submit = new DialogSubmit<PrecisionAnalysis>(null, { refusal: finishRefusal });

  protected finish(): void {
    this.submit.runAndClose(this.service.finish(this.data.roundId));
  }
}
