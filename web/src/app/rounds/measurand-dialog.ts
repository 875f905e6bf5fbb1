import { ChangeDetectionStrategy, Component, inject, signal } from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MAT_DIALOG_DATA, MatDialogModule, MatDialogRef } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';
import type { Observable } from 'rxjs';
import { type Measurand, MeasurandInput, MeasurandUpdate } from '@ringlet/shared/contracts/rounds';
import { errorMessage } from '../core/zod-form-errors';
import { parseWith, pathMap, showServerError } from './form-errors';
import {
  ASSIGNED_VALUE_KIND_LABELS,
  type AssignedValueRuleForm,
  assignedRuleFromForm,
  assignedRuleToForm,
  SIGMA_PT_KIND_LABELS,
  type SigmaPtRuleForm,
  sigmaRuleFromForm,
  sigmaRuleToForm,
} from './measurand-rules';
import { RoundsService } from './rounds-service';
import { SigmaSourcePicker, sigmaStudyLink } from './sigma-source-picker';

export interface MeasurandDialogData {
  readonly roundId: string;
  readonly schemeId: string; // its finished precision studies can give σ_R
  /** The measurand to edit; absent to add one. */
  readonly measurand?: Measurand;
}

const num = (v: number | null) => (v === null || (v as unknown) === '' ? null : Number(v));

/** Add or edit one measurand with its σ_pt and assigned-value rules. Closes with true once saved. */
@Component({
  selector: 'app-measurand-dialog',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [
    ReactiveFormsModule,
    MatDialogModule,
    MatFormFieldModule,
    MatInputModule,
    MatSelectModule,
    MatButtonModule,
    SigmaSourcePicker,
  ],
  template: `
    <h2 mat-dialog-title>
      {{ data.measurand ? 'Edit measurand ' + data.measurand.name : 'Add a measurand' }}
    </h2>
    <form [formGroup]="form" (ngSubmit)="submit()" novalidate>
      <mat-dialog-content class="form-stack">
        <div class="row">
          <mat-form-field>
            <mat-label>File code</mat-label>
            <input matInput formControlName="key" placeholder="z_average" />
            <mat-error>{{ errorMessage(form.controls.key) }}</mat-error>
          </mat-form-field>
          <mat-form-field class="grow">
            <mat-label>Name</mat-label>
            <input matInput formControlName="name" />
            <mat-error>{{ errorMessage(form.controls.name) }}</mat-error>
          </mat-form-field>
        </div>
        <div class="row">
          <mat-form-field>
            <mat-label>Unit</mat-label>
            <input matInput formControlName="unit" placeholder="nm" />
            <mat-error>{{ errorMessage(form.controls.unit) }}</mat-error>
          </mat-form-field>
          <mat-form-field>
            <mat-label>Decimals</mat-label>
            <input matInput type="number" min="0" max="6" formControlName="decimals" />
            <mat-error>{{ errorMessage(form.controls.decimals) }}</mat-error>
          </mat-form-field>
          <mat-form-field>
            <mat-label>Replicates required</mat-label>
            <input matInput type="number" min="1" max="20" formControlName="replicatesRequired" />
            <mat-error>{{ errorMessage(form.controls.replicatesRequired) }}</mat-error>
          </mat-form-field>
          <mat-form-field>
            <mat-label>Minimum participants</mat-label>
            <input matInput type="number" min="1" formControlName="minParticipants" />
            <mat-error>{{ errorMessage(form.controls.minParticipants) }}</mat-error>
          </mat-form-field>
        </div>

        <fieldset formGroupName="sigmaPtRule" class="rule">
          <legend>σ_pt (standard deviation for proficiency assessment)</legend>
          <mat-form-field class="kind">
            <mat-label>σ_pt rule</mat-label>
            <mat-select formControlName="kind" data-testid="sigma-kind">
              @for (k of sigmaKinds; track k[0]) {
                <mat-option [value]="k[0]">{{ k[1] }}</mat-option>
              }
            </mat-select>
          </mat-form-field>
          @switch (form.controls.sigmaPtRule.controls.kind.value) {
            @case ('fixed') {
              <mat-form-field>
                <mat-label
                  >σ_pt ({{ form.controls.unit.value || 'unit of the measurand' }})</mat-label
                >
                <input matInput type="number" formControlName="value" />
                <mat-error>{{ errorMessage(form.controls.sigmaPtRule.controls.value) }}</mat-error>
              </mat-form-field>
            }
            @case ('percent') {
              <mat-form-field>
                <mat-label>Percent of x_pt</mat-label>
                <input
                  matInput
                  type="number"
                  min="0"
                  max="100"
                  step="0.1"
                  formControlName="percent"
                />
                <mat-error>{{
                  errorMessage(form.controls.sigmaPtRule.controls.percent)
                }}</mat-error>
              </mat-form-field>
            }
            @case ('precision') {
              <mat-form-field>
                <mat-label
                  >σ_R ({{ form.controls.unit.value || 'unit of the measurand' }})</mat-label
                >
                <input matInput type="number" formControlName="sigmaR" />
                @if (link.study(); as s) {
                  <mat-hint>from precision study {{ s.roundCode }}</mat-hint>
                }
                <mat-error>{{ errorMessage(form.controls.sigmaPtRule.controls.sigmaR) }}</mat-error>
              </mat-form-field>
              <mat-form-field class="grow">
                <mat-label>Source of σ_R (precision study)</mat-label>
                <input matInput formControlName="source" />
                <mat-error>{{ errorMessage(form.controls.sigmaPtRule.controls.source) }}</mat-error>
              </mat-form-field>
              <app-sigma-source-picker
                [schemeId]="data.schemeId"
                [measurandKey]="form.controls.key.value"
                (picked)="link.take($event, form.controls.replicatesRequired.value)"
              />
            }
          }
        </fieldset>

        <fieldset formGroupName="assignedValueRule" class="rule">
          <legend>Assigned value (x_pt)</legend>
          <mat-form-field class="kind">
            <mat-label>Assigned-value rule</mat-label>
            <mat-select formControlName="kind" data-testid="assigned-kind">
              @for (k of assignedKinds; track k[0]) {
                <mat-option [value]="k[0]">{{ k[1] }}</mat-option>
              }
            </mat-select>
          </mat-form-field>
          @if (form.controls.assignedValueRule.controls.kind.value === 'reference') {
            <mat-form-field>
              <mat-label>Reference value</mat-label>
              <input matInput type="number" formControlName="value" />
              <mat-error>{{
                errorMessage(form.controls.assignedValueRule.controls.value)
              }}</mat-error>
            </mat-form-field>
            <mat-form-field>
              <mat-label>Standard uncertainty u</mat-label>
              <input matInput type="number" min="0" formControlName="u" />
              <mat-error>{{ errorMessage(form.controls.assignedValueRule.controls.u) }}</mat-error>
            </mat-form-field>
            <mat-form-field class="grow">
              <mat-label>Source of the reference value</mat-label>
              <input matInput formControlName="source" />
              <mat-error>{{
                errorMessage(form.controls.assignedValueRule.controls.source)
              }}</mat-error>
            </mat-form-field>
          }
        </fieldset>
        @if (failure(); as message) {
          <p class="form-error" role="alert">{{ message }}</p>
        }
      </mat-dialog-content>
      <mat-dialog-actions align="end">
        <button mat-button type="button" mat-dialog-close>Cancel</button>
        <button mat-flat-button type="submit" [disabled]="busy()" data-testid="save-measurand">
          {{ data.measurand ? 'Save measurand' : 'Add measurand' }}
        </button>
      </mat-dialog-actions>
    </form>
  `,
  styles: `
    .row,
    .rule {
      display: flex;
      gap: 12px;
      flex-wrap: wrap;
    }
    .row mat-form-field,
    .rule mat-form-field {
      flex: 0 1 170px;
    }
    .row .grow,
    .rule .grow {
      flex: 1 1 240px;
    }
    .rule .kind {
      flex: 0 1 320px;
    }
    .rule {
      border: 1px solid #d5dbe3;
      border-radius: 6px;
      margin: 0 0 10px;
      padding: 8px 12px 0;
    }
  `,
})
export class MeasurandDialog {
  protected readonly data = inject<MeasurandDialogData>(MAT_DIALOG_DATA);
  private readonly api = inject(RoundsService);
  private readonly ref = inject<MatDialogRef<MeasurandDialog, true>>(MatDialogRef);
  private readonly fb = inject(NonNullableFormBuilder);
  protected readonly errorMessage = errorMessage;
  protected readonly sigmaKinds = Object.entries(SIGMA_PT_KIND_LABELS);
  protected readonly assignedKinds = Object.entries(ASSIGNED_VALUE_KIND_LABELS);
  protected readonly busy = signal(false);
  protected readonly failure = signal<string | null>(null);

  private readonly m = this.data.measurand;
  private readonly sigma: SigmaPtRuleForm = sigmaRuleToForm(
    this.m?.sigmaPtRule ?? { kind: 'robust-sd' },
  );
  private readonly assigned: AssignedValueRuleForm = assignedRuleToForm(
    this.m?.assignedValueRule ?? { kind: 'consensus' },
  );
  protected readonly form = this.fb.group({
    key: [this.m?.key ?? ''],
    name: [this.m?.name ?? ''],
    unit: [this.m?.unit ?? ''],
    decimals: [this.m?.decimals ?? (1 as number | null)],
    replicatesRequired: [this.m?.replicatesRequired ?? (3 as number | null)],
    // 12 participants minimum: common practice (see DLS_DEFAULT_MEASURANDS)
    minParticipants: [this.m?.minParticipants ?? (12 as number | null)],
    sigmaPtRule: this.fb.group({
      kind: [this.sigma.kind],
      value: [this.sigma.value],
      percent: [this.sigma.percent],
      sigmaR: [this.sigma.sigmaR],
      source: [this.sigma.source],
    }),
    assignedValueRule: this.fb.group({
      kind: [this.assigned.kind],
      value: [this.assigned.value],
      u: [this.assigned.u],
      source: [this.assigned.source],
    }),
  });
  protected readonly link = sigmaStudyLink(
    this.form.controls.sigmaPtRule.controls.sigmaR,
    this.m?.sigmaPtRule,
  );
  /** Adding goes through the batch route, whose paths start with measurands.0. */
  private readonly paths = pathMap('measurands.0.');

  protected submit(): void {
    const raw = this.form.getRawValue();
    const candidate = {
      key: raw.key,
      name: raw.name,
      unit: raw.unit,
      decimals: num(raw.decimals),
      replicatesRequired: num(raw.replicatesRequired),
      minParticipants: num(raw.minParticipants),
      sigmaPtRule: sigmaRuleFromForm(raw.sigmaPtRule, this.link.rule()),
      assignedValueRule: assignedRuleFromForm(raw.assignedValueRule),
    };
    let call: Observable<unknown>;
    if (this.m) {
      const value = parseWith(this.form, MeasurandUpdate, candidate, this.failure);
      if (!value) return;
      call = this.api.updateMeasurand(this.data.roundId, this.m.id, value);
    } else {
      const value = parseWith(this.form, MeasurandInput, candidate, this.failure);
      if (!value) return;
      call = this.api.addMeasurands(this.data.roundId, [value]);
    }
    this.busy.set(true);
    call.subscribe({
      next: () => this.ref.close(true),
      error: (e: unknown) => {
        this.busy.set(false);
        showServerError(this.form, e, this.failure, this.paths);
      },
    });
  }
}
