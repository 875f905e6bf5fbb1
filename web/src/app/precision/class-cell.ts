import { ChangeDetectionStrategy, Component, signal } from '@angular/core';
import type { ICellRendererAngularComp } from 'ag-grid-angular';
import type { ICellRendererParams } from 'ag-grid-community';
import type { PrecisionClassification } from '@ringlet/shared/contracts/precision';
import { ClassBadge } from './class-badge';

/** Grid cell showing a cell's class with {@link ClassBadge}. */
@Component({
  selector: 'app-class-cell',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [ClassBadge],
  templateUrl: './class-cell.html',
})
export class ClassCell implements ICellRendererAngularComp {
  protected readonly value = signal<PrecisionClassification | 'set-aside' | null>(null);
  agInit(params: ICellRendererParams): void {
    this.refresh(params);
  }
  refresh(params: ICellRendererParams): boolean {
    this.value.set((params.value as PrecisionClassification | 'set-aside' | undefined) ?? null);
    return true;
  }
}
