import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { NonNullableFormBuilder } from '@angular/forms';
import {
  PrecisionReferencesBody,
  type PrecisionAnalysis,
} from '@ringlet/shared/contracts/precision';
import { errorMessage } from '../core/zod-form-errors';
import { FORM_DIALOG_IMPORTS } from '../shared/dialog-actions';
import { dialogData, DialogSubmit } from '../shared/dialog-submit';
import { PrecisionService } from './precision-service';

export interface ReferencesDialogData {
  readonly roundId: string;
  readonly analysis: PrecisionAnalysis;
}

/** One level × measurand of the form. */
interface Row {
  readonly itemCode: string;
  readonly measurandKey: string;
  readonly title: string;
  readonly unit: string;
}

/**
 * The accepted reference values of the levels (item × measurand), for the bias (ISO 5725-4).
 * An empty value clears the level's reference. Saving replaces the whole list and closes with
 * the server's analysis; a refusal stays in the dialog, under its field.
 */
@Component({
  selector: 'app-precision-references-dialog',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [FORM_DIALOG_IMPORTS],
  templateUrl: './references-dialog.html',
  styles: `
    .reference-row {
      display: flex;
      flex-wrap: wrap;
      gap: 0 12px;
    }
    .reference-row mat-form-field {
      flex: 1 1 140px;
    }
    .reference-row .source {
      flex: 2 1 220px;
    }
  `,
})
export class ReferencesDialog {
  protected readonly data = dialogData<ReferencesDialogData>();
  private readonly service = inject(PrecisionService);
  private readonly fb = inject(NonNullableFormBuilder);
  protected readonly errorMessage = errorMessage;
  protected readonly rows: readonly Row[] = this.data.analysis.measurands.flatMap((m) =>
    m.levels.map((l) => ({
      itemCode: l.itemCode,
      measurandKey: m.key,
      title: `${l.itemLabel} · ${m.label}`,
      unit: m.unit,
    })),
  );
  protected readonly form = this.fb.group({
    rows: this.fb.array(
      this.rows.map((r) => {
        const known = this.data.analysis.references.find(
          (x) => x.itemCode === r.itemCode && x.measurandKey === r.measurandKey,
        );
        return this.fb.group({
          value: this.fb.control<number | null>(known?.value ?? null),
          u: this.fb.control<number | null>(known?.u ?? null),
          source: [known?.source ?? ''],
        });
      }),
    ),
  });
  /** The form rows of the filled references, in the order they are sent. */
  private filled: number[] = [];
  protected readonly submit = new DialogSubmit<PrecisionAnalysis>(this.form, {
    // the contract's "references.3.value" is the form's "rows.<row of the 4th filled one>.value"
    map: (path) =>
      path.replace(/^references\.(\d+)/, (_, k: string) => `rows.${this.filled[Number(k)] ?? k}`),
  });

  /** Clears one level's reference (saved with the rest). */
  protected clear(i: number): void {
    this.form.controls.rows.at(i).reset({ value: null, u: null, source: '' });
  }

  protected save(): void {
    const filled: number[] = [];
    const references = this.form.controls.rows.getRawValue().flatMap((v, i) => {
      if (v.value === null && v.u === null && v.source.trim() === '') return [];
      filled.push(i);
      const r = this.rows[i]!;
      return [{ itemCode: r.itemCode, measurandKey: r.measurandKey, ...v }];
    });
    this.filled = filled;
    this.submit.submitAndClose(PrecisionReferencesBody, { references }, (body) =>
      this.service.references(this.data.roundId, body),
    );
  }
}
