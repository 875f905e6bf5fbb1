import { ChangeDetectionStrategy, Component, inject, signal } from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MAT_DIALOG_DATA, MatDialogModule, MatDialogRef } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import {
  PrecisionReferencesBody,
  type PrecisionAnalysis,
} from '@ringlet/shared/contracts/precision';
import { errorMessage } from '../core/zod-form-errors';
import { parseWith, showServerError, type PathMap } from '../rounds/form-errors';
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
  imports: [
    ReactiveFormsModule,
    MatDialogModule,
    MatFormFieldModule,
    MatInputModule,
    MatButtonModule,
  ],
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
  protected readonly data = inject<ReferencesDialogData>(MAT_DIALOG_DATA);
  private readonly ref = inject<MatDialogRef<ReferencesDialog, PrecisionAnalysis>>(MatDialogRef);
  private readonly service = inject(PrecisionService);
  private readonly fb = inject(NonNullableFormBuilder);
  protected readonly errorMessage = errorMessage;
  protected readonly failure = signal<string | null>(null);
  protected readonly saving = signal(false);
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

  /** Clears one level's reference (saved with the rest). */
  protected clear(i: number): void {
    this.form.controls.rows.at(i).reset({ value: null, u: null, source: '' });
  }

  protected submit(): void {
    const filled: number[] = [];
    const references = this.form.controls.rows.getRawValue().flatMap((v, i) => {
      if (v.value === null && v.u === null && v.source.trim() === '') return [];
      filled.push(i);
      const r = this.rows[i]!;
      return [{ itemCode: r.itemCode, measurandKey: r.measurandKey, ...v }];
    });
    // the contract's "references.3.value" is the form's "rows.<row of the 4th filled one>.value"
    const toForm: PathMap = (path) =>
      path.replace(/^references\.(\d+)/, (_, k: string) => `rows.${filled[Number(k)] ?? k}`);
    const body = parseWith(
      this.form,
      PrecisionReferencesBody,
      { references },
      this.failure,
      toForm,
    );
    if (!body) return;
    this.saving.set(true);
    this.service.references(this.data.roundId, body).subscribe({
      next: (a) => this.ref.close(a),
      error: (e: unknown) => {
        this.saving.set(false);
        showServerError(this.form, e, this.failure, toForm);
      },
    });
  }
}
