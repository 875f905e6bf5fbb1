import { ChangeDetectionStrategy, Component, input } from '@angular/core';
import { type FormControl, ReactiveFormsModule } from '@angular/forms';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';
import type { MyRoundDetail } from '@ringlet/shared/contracts/bench';
import { CONDITION_FIELDS, type ResultsForm } from '../results-form';

const UNCERTAINTY_KINDS = [
  { value: 'none', label: 'None given' },
  { value: 'standard', label: 'Standard u' },
  { value: 'expanded', label: 'Expanded U' },
] as const;

/** The two numeric cells after the uncertainty type: its value and the coverage factor. */
const UNCERTAINTY_CELLS = [
  { key: 'uValue', label: 'uncertainty value', narrow: false },
  { key: 'k', label: 'coverage factor k', narrow: true },
] as const;

/** The path of a replicate in the submission data, as the checks name it. */
export function replicatePath(item: number, measurand: number, run: number): string {
  return `items.${item}.results.${measurand}.replicates.${run}`;
}

/** Results entry of one round: per item, the replicates and uncertainty of each measurand, and the measurement conditions. */
@Component({
  selector: 'app-results-entry',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [ReactiveFormsModule, MatFormFieldModule, MatInputModule, MatSelectModule],
  templateUrl: './results-entry.html',
  styleUrl: '../bench-round/bench-round.scss',
})
export class ResultsEntry {
  readonly round = input.required<MyRoundDetail>();
  readonly form = input.required<ResultsForm>();
  /** The blocking errors of the checks while typing, by path in the submission data. */
  readonly errors = input.required<ReadonlyMap<string, string>>();
  protected readonly uncertaintyKinds = UNCERTAINTY_KINDS;
  protected readonly uncertaintyCells = UNCERTAINTY_CELLS;
  protected readonly conditionFields = CONDITION_FIELDS;
  protected readonly repPath = replicatePath;

  protected rep(ii: number, mi: number, k: number): FormControl<number | null> {
    return this.form().at(ii).controls.results.at(mi).controls.replicates.at(k);
  }
  protected row(ii: number, mi: number) {
    return this.form().at(ii).controls.results.at(mi).controls;
  }
  protected cond(ii: number, key: string): FormControl {
    return this.form().at(ii).controls.conditions.get(key) as FormControl;
  }
  protected notes(ii: number): FormControl<string> {
    return this.form().at(ii).controls.methodNotes;
  }
  protected runIndexes(n: number): number[] {
    return Array.from({ length: n }, (_, i) => i);
  }
}
