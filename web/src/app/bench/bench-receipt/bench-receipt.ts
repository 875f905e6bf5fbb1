import {
  ChangeDetectionStrategy,
  Component,
  computed,
  effect,
  inject,
  input,
  output,
  signal,
  untracked,
} from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { NonNullableFormBuilder, ReactiveFormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';
import {
  type MyRoundDetail,
  ReceiptInput,
  SHIPMENT_CONDITION_LABELS,
  type ShipmentCondition,
} from '@ringlet/shared/contracts/bench';
import { DAMAGED_PARCEL_CAUTIONS } from '@ringlet/shared/contracts/safety';
import { FileDrop } from '../../core/file-drop';
import { problemMessage } from '../../core/problem';
import { BenchService } from '../bench-service';
import { isParcelDamaged } from './receipt-rules';

const CONDITIONS = (Object.entries(SHIPMENT_CONDITION_LABELS) as [ShipmentCondition, string][]).map(
  ([value, label]) => ({ value, label }),
);

/** Recording the receipt of a round's test items (date, condition, notes, optional photo). */
@Component({
  selector: 'app-bench-receipt',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [
    ReactiveFormsModule,
    MatButtonModule,
    MatFormFieldModule,
    MatInputModule,
    MatSelectModule,
    FileDrop,
  ],
  templateUrl: './bench-receipt.html',
  styleUrl: '../bench-round/bench-round.scss',
})
export class BenchReceipt {
  readonly round = input.required<MyRoundDetail>();
  /** The round as stored after the receipt was recorded. */
  readonly saved = output<MyRoundDetail>();
  private readonly bench = inject(BenchService);
  protected readonly conditions = CONDITIONS;
  protected readonly damagedCautions = DAMAGED_PARCEL_CAUTIONS;
  protected readonly conditionLabel = (c: ShipmentCondition | null | undefined) =>
    c ? SHIPMENT_CONDITION_LABELS[c] : '';
  protected readonly receiptForm = inject(NonNullableFormBuilder).group({
    receivedOn: [new Date().toISOString().slice(0, 10)],
    condition: ['intact' as ShipmentCondition],
    notes: [''],
  });
  private receiptPhoto: File | null = null;
  protected readonly receiptMessage = signal<string | null>(null);
  private readonly chosenCondition = toSignal(this.receiptForm.controls.condition.valueChanges, {
    initialValue: this.receiptForm.controls.condition.value,
  });
  /** The damaged-parcel cautions show while the form or the record says damaged or leaked. */
  protected readonly parcelDamaged = computed(() =>
    isParcelDamaged(this.chosenCondition(), this.round().receipt?.condition ?? null),
  );

  constructor() {
    effect(() => {
      const receipt = this.round().receipt;
      if (!receipt?.receivedOn) return;
      untracked(() =>
        this.receiptForm.setValue({
          receivedOn: receipt.receivedOn!,
          condition: receipt.condition ?? 'intact',
          notes: receipt.notes ?? '',
        }),
      );
    });
  }

  protected photoPicked(file: File): void {
    this.receiptPhoto = file;
  }
  protected saveReceipt(): void {
    const parsed = ReceiptInput.safeParse(this.receiptForm.getRawValue());
    if (!parsed.success) return this.receiptMessage.set(parsed.error.issues[0]!.message);
    this.bench.saveReceipt(this.round().roundId, parsed.data, this.receiptPhoto).subscribe({
      next: (r) => {
        this.saved.emit(r);
        this.receiptMessage.set('Receipt recorded.');
      },
      error: (e) => this.receiptMessage.set(problemMessage(e)),
    });
  }
}
