import { DatePipe, DecimalPipe } from '@angular/common';
import {
  ChangeDetectionStrategy,
  Component,
  computed,
  inject,
  input,
  output,
  signal,
} from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { FormArray, FormControl, FormGroup, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { DEFAULT_CHECK } from '@ringlet/shared/bench/instrument-check';
import { type InstrumentCheck, InstrumentCheckInput } from '@ringlet/shared/contracts/bench';
import { fieldLabel, problemMessage } from '../../core/problem';
import { BenchService } from '../bench-service';
import { checkPreview } from './check-preview';

const run = () =>
  new FormGroup({
    zAverageNm: new FormControl<number | null>(null, Validators.required),
    pdi: new FormControl<number | null>(null, Validators.required),
    temperatureC: new FormControl<number | null>(DEFAULT_CHECK.setPointC, Validators.required),
    equilibrationMin: new FormControl<number | null>(
      DEFAULT_CHECK.minEquilibrationMin,
      Validators.required,
    ),
  });

/** The cells of one check replicate, in the table's order, with what a screen reader hears. */
const RUN_CELLS = [
  { key: 'zAverageNm', label: 'Z-average (nm)' },
  { key: 'pdi', label: 'PDI' },
  { key: 'temperatureC', label: 'temperature (°C)' },
  { key: 'equilibrationMin', label: 'equilibration (min)' },
] as const;

/** The lab's instrument check on a reference material: the form with its live verdict, and the history. */
@Component({
  selector: 'app-instrument-check',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [
    DatePipe,
    DecimalPipe,
    ReactiveFormsModule,
    MatButtonModule,
    MatFormFieldModule,
    MatInputModule,
  ],
  templateUrl: './instrument-check.html',
  styleUrl: '../bench-round/bench-round.scss',
})
export class InstrumentCheckCard {
  /** The lab's checks, newest first. */
  readonly checks = input.required<readonly InstrumentCheck[]>();
  /** A check the server stored. */
  readonly recorded = output<InstrumentCheck>();
  private readonly bench = inject(BenchService);
  protected readonly runCells = RUN_CELLS;
  protected readonly checkForm = new FormGroup({
    instrument: new FormControl('', { nonNullable: true }),
    material: new FormControl<string>(DEFAULT_CHECK.material, { nonNullable: true }),
    referenceValueNm: new FormControl<number>(DEFAULT_CHECK.referenceValueNm, {
      nonNullable: true,
    }),
    toleranceNm: new FormControl<number>(DEFAULT_CHECK.toleranceNm, { nonNullable: true }),
    pdiLimit: new FormControl<number>(DEFAULT_CHECK.pdiLimit, { nonNullable: true }),
    setPointC: new FormControl<number>(DEFAULT_CHECK.setPointC, { nonNullable: true }),
    temperatureToleranceC: new FormControl<number>(DEFAULT_CHECK.temperatureToleranceC, {
      nonNullable: true,
    }),
    minEquilibrationMin: new FormControl<number>(DEFAULT_CHECK.minEquilibrationMin, {
      nonNullable: true,
    }),
    runs: new FormArray([run(), run(), run()]),
    notes: new FormControl('', { nonNullable: true }),
  });
  protected readonly checkMessage = signal<string | null>(null);
  private readonly checkValue = toSignal(this.checkForm.valueChanges, {
    initialValue: this.checkForm.getRawValue(),
  });
  protected readonly checkPreview = computed(() => {
    this.checkValue();
    return checkPreview(this.checkForm.getRawValue());
  });

  protected get checkRuns() {
    return this.checkForm.controls.runs;
  }
  protected addRun(): void {
    this.checkRuns.push(run());
  }
  protected recordCheck(): void {
    const parsed = InstrumentCheckInput.safeParse(this.checkForm.getRawValue());
    if (!parsed.success) {
      const i = parsed.error.issues[0]!;
      return this.checkMessage.set(`${fieldLabel(i.path.map(String).join('.'))}: ${i.message}`);
    }
    this.bench.recordCheck(parsed.data).subscribe({
      next: (c) => {
        this.recorded.emit(c);
        this.checkMessage.set(
          c.verdict.passed ? 'Check recorded: passed.' : 'Check recorded: failed.',
        );
      },
      error: (e) => this.checkMessage.set(problemMessage(e)),
    });
  }
}
