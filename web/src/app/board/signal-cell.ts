import { ChangeDetectionStrategy, Component, signal } from '@angular/core';
import type { ICellRendererAngularComp } from 'ag-grid-angular';
import type { ICellRendererParams } from 'ag-grid-community';
import { SignalBadge, type SignalKind } from '../core/signal-badge';

/** Grid cell: the signal as shape + word + colour, "—" when there is no score. */
@Component({
  selector: 'app-signal-cell',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [SignalBadge],
  template: `@if (value(); as s) {
      <app-signal-badge [signal]="s" />
    } @else {
      <span aria-label="no score">—</span>
    }`,
})
export class SignalCell implements ICellRendererAngularComp {
  protected readonly value = signal<SignalKind | null>(null);
  agInit(params: ICellRendererParams): void {
    this.refresh(params);
  }
  refresh(params: ICellRendererParams): boolean {
    this.value.set((params.value as SignalKind | null) ?? null);
    return true;
  }
}
