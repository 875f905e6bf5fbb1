import { ChangeDetectionStrategy, Component, inject, signal } from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MAT_DIALOG_DATA, MatDialogModule, MatDialogRef } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';
import {
  DEFAULT_INSTRUCTIONS,
  ROUND_KIND_LABELS,
  RoundCreate,
  type RoundKind,
  type Scheme,
} from '@ringlet/shared/contracts/rounds';
import { errorMessage } from '../core/zod-form-errors';
import { parseWith, showServerError } from './form-errors';
import { RoundScheduleFields } from './round-schedule-fields';
import { RoundsService } from './rounds-service';

export interface RoundDialogData {
  readonly schemes: readonly Scheme[];
}

/** A local date-time input ("2026-03-31T12:00") → ISO 8601 UTC, or null when empty. */
export function localToIso(value: string): string | null {
  if (!value) return null;
  const d = new Date(value);
  return Number.isNaN(d.getTime()) ? value : d.toISOString();
}

/** Create a round in draft, with its test items; the scheme's measurands come along. */
@Component({
  selector: 'app-round-dialog',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [
    ReactiveFormsModule,
    RoundScheduleFields,
    MatDialogModule,
    MatFormFieldModule,
    MatInputModule,
    MatSelectModule,
    MatButtonModule,
    MatIconModule,
  ],
  template: `
    <h2 mat-dialog-title>New round</h2>
    <form [formGroup]="form" (ngSubmit)="submit()" novalidate>
      <mat-dialog-content class="form-stack">
        <div class="row">
          <mat-form-field>
            <mat-label>Scheme</mat-label>
            <mat-select formControlName="schemeId">
              @for (s of data.schemes; track s.id) {
                <mat-option [value]="s.id">{{ s.code }} · {{ s.name }}</mat-option>
              }
            </mat-select>
            <mat-error>{{ errorMessage(form.controls.schemeId) }}</mat-error>
          </mat-form-field>
          <mat-form-field>
            <mat-label>Round code</mat-label>
            <input matInput formControlName="code" placeholder="DLS-2026-1" />
            <mat-error>{{ errorMessage(form.controls.code) }}</mat-error>
          </mat-form-field>
        </div>
        <mat-form-field>
          <mat-label>Kind</mat-label>
          <mat-select formControlName="kind" data-testid="round-kind">
            <mat-option value="pt">{{ kindLabels.pt }}: scores each lab (ISO 13528)</mat-option>
            <mat-option value="precision"
              >{{ kindLabels.precision }}: s_r and s_R of the method (ISO 5725-2)</mat-option
            >
          </mat-select>
        </mat-form-field>
        <mat-form-field>
          <mat-label>Title</mat-label>
          <input matInput formControlName="title" />
          <mat-error>{{ errorMessage(form.controls.title) }}</mat-error>
        </mat-form-field>
        <app-round-schedule-fields [group]="form" />
        <div class="row">
          <mat-form-field>
            <mat-label>Participation fee</mat-label>
            <input matInput type="number" min="0" step="0.01" formControlName="fee" />
            <mat-error>{{ errorMessage(form.controls.fee) }}</mat-error>
          </mat-form-field>
          <mat-form-field>
            <mat-label>Currency</mat-label>
            <input matInput formControlName="currency" />
            <mat-error>{{ errorMessage(form.controls.currency) }}</mat-error>
          </mat-form-field>
          <mat-form-field>
            <mat-label>Protocol temperature (°C)</mat-label>
            <input matInput type="number" formControlName="protocolTemperatureC" />
            <mat-error>{{ errorMessage(form.controls.protocolTemperatureC) }}</mat-error>
          </mat-form-field>
        </div>
        <mat-form-field>
          <mat-label
            >Instructions for labs (the safety cautions always open them; add your own)</mat-label
          >
          <textarea matInput formControlName="instructions" rows="5"></textarea>
          <mat-error>{{ errorMessage(form.controls.instructions) }}</mat-error>
        </mat-form-field>

        <h3>Test items</h3>
        <div formArrayName="items" class="items">
          @for (item of form.controls.items.controls; track item; let i = $index) {
            <fieldset [formGroupName]="i" class="item" [attr.data-testid]="'item-' + i">
              <legend>Item {{ i + 1 }}</legend>
              <mat-form-field class="code">
                <mat-label>Item code</mat-label>
                <input matInput formControlName="code" />
                <mat-error>{{ errorMessage(item.controls.code) }}</mat-error>
              </mat-form-field>
              <mat-form-field class="material">
                <mat-label>Material</mat-label>
                <input matInput formControlName="material" />
                <mat-error>{{ errorMessage(item.controls.material) }}</mat-error>
              </mat-form-field>
              <mat-form-field class="size">
                <mat-label>Nominal size (nm)</mat-label>
                <input matInput type="number" formControlName="nominalSizeNm" />
                <mat-error>{{ errorMessage(item.controls.nominalSizeNm) }}</mat-error>
              </mat-form-field>
              <mat-form-field class="notes">
                <mat-label>Storage notes</mat-label>
                <input matInput formControlName="storageNotes" />
              </mat-form-field>
              <mat-form-field class="notes">
                <mat-label>Handling notes</mat-label>
                <input matInput formControlName="handlingNotes" />
              </mat-form-field>
              <button
                mat-icon-button
                type="button"
                [attr.aria-label]="'Remove item ' + (i + 1)"
                (click)="removeItem(i)"
              >
                <mat-icon>delete</mat-icon>
              </button>
            </fieldset>
          }
        </div>
        <button mat-stroked-button type="button" data-testid="add-item" (click)="addItem()">
          <mat-icon>add</mat-icon> Add test item
        </button>
        @if (failure(); as message) {
          <p class="form-error" role="alert">{{ message }}</p>
        }
      </mat-dialog-content>
      <mat-dialog-actions align="end">
        <button mat-button type="button" mat-dialog-close>Cancel</button>
        <button mat-flat-button type="submit" [disabled]="busy()">Create round</button>
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
    .item {
      display: flex;
      flex-wrap: wrap;
      gap: 8px;
      border: 1px solid #d5dbe3;
      border-radius: 6px;
      margin: 0 0 8px;
    }
    .item .code {
      width: 110px;
    }
    .item .material {
      flex: 1 1 220px;
    }
    .item .size {
      width: 150px;
    }
    .item .notes {
      flex: 1 1 200px;
    }
  `,
})
export class RoundDialog {
  protected readonly data = inject<RoundDialogData>(MAT_DIALOG_DATA);
  private readonly api = inject(RoundsService);
  private readonly ref = inject<MatDialogRef<RoundDialog, string>>(MatDialogRef);
  private readonly fb = inject(NonNullableFormBuilder);
  protected readonly errorMessage = errorMessage;
  protected readonly kindLabels = ROUND_KIND_LABELS;
  protected readonly busy = signal(false);
  protected readonly failure = signal<string | null>(null);
  protected readonly form = this.fb.group({
    schemeId: [this.data.schemes[0]?.id ?? ''],
    code: [''],
    kind: ['pt' as RoundKind],
    title: [''],
    enrolmentClosesOn: [''],
    dispatchOn: [''],
    resultsDueAt: [''],
    fee: [0],
    currency: ['EUR'],
    protocolTemperatureC: [25],
    instructions: [DEFAULT_INSTRUCTIONS],
    items: this.fb.array([this.itemGroup()]),
  });

  private itemGroup() {
    return this.fb.group({
      code: [''],
      material: [''],
      nominalSizeNm: [null as number | null],
      storageNotes: [''],
      handlingNotes: [''],
    });
  }

  protected addItem(): void {
    this.form.controls.items.push(this.itemGroup());
  }

  protected removeItem(i: number): void {
    this.form.controls.items.removeAt(i);
  }

  protected submit(): void {
    const raw = this.form.getRawValue();
    const value = parseWith(
      this.form,
      RoundCreate,
      {
        schemeId: raw.schemeId,
        code: raw.code,
        kind: raw.kind,
        title: raw.title,
        enrolmentClosesOn: raw.enrolmentClosesOn || null,
        dispatchOn: raw.dispatchOn || null,
        resultsDueAt: localToIso(raw.resultsDueAt),
        feeMinor: Math.round(Number(raw.fee) * 100),
        currency: raw.currency,
        protocolTemperatureC: Number(raw.protocolTemperatureC),
        instructions: raw.instructions,
        items: raw.items.map((i) => ({
          ...i,
          nominalSizeNm:
            i.nominalSizeNm === null || (i.nominalSizeNm as unknown) === ''
              ? null
              : Number(i.nominalSizeNm),
        })),
      },
      this.failure,
    );
    if (!value) return;
    this.busy.set(true);
    this.api.createRound(value).subscribe({
      next: (r) => this.ref.close(r.id),
      error: (e: unknown) => {
        this.busy.set(false);
        showServerError(this.form, e, this.failure);
      },
    });
  }
}
