import { ChangeDetectionStrategy, Component, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import type { ICellRendererAngularComp } from 'ag-grid-angular';
import type { ICellRendererParams } from 'ag-grid-community';

/** One action in a grid row: a visible, keyboard-reachable button. */
export interface RowAction<T> {
  readonly label: string;
  /** Accessible name; defaults to the label. */
  readonly ariaLabel?: (row: T) => string;
  readonly run: (row: T) => void;
}

export type ActionCellParams<T> = ICellRendererParams<T> & { actions: readonly RowAction<T>[] };

/** Grid cell renderer with text buttons for row actions (e.g. "Edit", "Members"). */
@Component({
  selector: 'app-action-cell',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatButtonModule],
  template: `
    @for (action of actions(); track action.label) {
      <button
        mat-button
        type="button"
        class="cell-action"
        [attr.aria-label]="action.ariaLabel ? action.ariaLabel(row()!) : null"
        (click)="action.run(row()!)"
      >
        {{ action.label }}
      </button>
    }
  `,
  styles: `
    :host {
      display: inline-flex;
      gap: 4px;
    }
    .cell-action {
      --mat-button-text-container-height: 28px;
    }
  `,
})
export class ActionCell<T> implements ICellRendererAngularComp {
  protected readonly actions = signal<readonly RowAction<T>[]>([]);
  protected readonly row = signal<T | undefined>(undefined);

  agInit(params: ActionCellParams<T>): void {
    this.refresh(params);
  }

  refresh(params: ActionCellParams<T>): boolean {
    this.actions.set(params.actions);
    this.row.set(params.data);
    return true;
  }
}
