import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { NonNullableFormBuilder } from '@angular/forms';
import { MatCheckboxModule } from '@angular/material/checkbox';
import { MAT_DIALOG_DATA, type MatDialog, MatDialogRef } from '@angular/material/dialog';
import { MatSelectModule } from '@angular/material/select';
import type { Observable } from 'rxjs';
import {
  DispatchInput,
  ExtensionGrant,
  HOMOGENEITY_DECISION_LABELS,
  type HomogeneityDecisionKind,
  StudyDecision,
  TransitionRequest,
  Withdrawal,
} from '@ringlet/shared/contracts/rounds';
import { errorMessage } from '../../core/zod-form-errors';
import { FORM_DIALOG_IMPORTS } from '../../shared/dialog-actions';
import { FormSubmit } from '../../shared/form-submit';
import { localToIso } from '../../shared/form-values';
import { openDialog } from '../../shared/open-dialog';
import { type DeskDialogData, deskConfirmLabel, deskFields } from './desk-dialog-data';

const DECISION_LABELS: Record<HomogeneityDecisionKind, string> = {
  ...HOMOGENEITY_DECISION_LABELS,
  accept: `${HOMOGENEITY_DECISION_LABELS.accept} (state why)`,
};

/**
 * The Round desk's small actions: a transition, a withdrawal, an extension, a dispatch, a
 * homogeneity decision or confirming a removal. The data says the kind; each kind's `send` takes
 * that kind's parsed contract value.
 */
@Component({
  selector: 'app-desk-dialog',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [FORM_DIALOG_IMPORTS, MatSelectModule, MatCheckboxModule],
  templateUrl: './desk-dialog.html',
})
export class DeskDialog<R> {
  protected readonly data = inject<DeskDialogData<R>>(MAT_DIALOG_DATA);
  private readonly ref = inject<MatDialogRef<DeskDialog<R>, R>>(MatDialogRef);
  protected readonly errorMessage = errorMessage;
  protected readonly decisions = Object.entries(DECISION_LABELS);
  protected readonly confirmLabel = deskConfirmLabel(this.data);
  protected readonly fields = deskFields(this.data);
  protected readonly whoIsTold = this.data.kind === 'transition' ? this.data.whoIsTold : undefined;
  protected readonly cautions = this.data.kind === 'dispatch' ? this.data.cautions : [];
  protected readonly form = inject(NonNullableFormBuilder).group({
    reason: [''],
    force: [false],
    courier: [''],
    trackingNumber: [''],
    dispatchedOn: [new Date().toISOString().slice(0, 10)],
    until: [''],
    decision: ['widen-sigma-pt' as HomogeneityDecisionKind],
  });
  protected readonly submission = new FormSubmit(this.form);

  /** The call for the kind with the parsed value, or null when a field is wrong. */
  private request(): Observable<R> | null {
    const d = this.data;
    const v = this.form.getRawValue();
    const parse = this.submission.parse.bind(this.submission);
    switch (d.kind) {
      case 'transition': {
        const body = { to: d.to, reason: v.reason.trim() || undefined, force: v.force };
        const p = parse(TransitionRequest, body);
        return p && d.send(p);
      }
      case 'withdrawal': {
        const p = parse(Withdrawal, { reason: v.reason });
        return p && d.send(p);
      }
      case 'extension': {
        const p = parse(ExtensionGrant, { until: localToIso(v.until) ?? '', reason: v.reason });
        return p && d.send(p);
      }
      case 'dispatch': {
        const body = {
          courier: v.courier,
          trackingNumber: v.trackingNumber,
          dispatchedOn: v.dispatchedOn,
        };
        const p = parse(DispatchInput, body);
        return p && d.send(p);
      }
      case 'decision': {
        const p = parse(StudyDecision, { decision: v.decision, reason: v.reason });
        return p && d.send(p);
      }
      case 'confirm':
        return d.send();
    }
  }

  protected submit(): void {
    const call = this.request();
    if (call) this.submission.run(call, (result) => this.ref.close(result));
  }
}

/** Opens the desk dialog for `data` and hands a successful answer to `after`. */
export function openDeskDialog<R>(
  dialog: MatDialog,
  data: DeskDialogData<R>,
  after: (value: R) => void,
): void {
  openDialog<DeskDialog<R>, DeskDialogData<R>, R>(dialog, DeskDialog<R>, data, '480px', after);
}
