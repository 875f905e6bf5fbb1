import { ChangeDetectionStrategy, Component, computed, inject, input, output } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatDialog } from '@angular/material/dialog';
import { MatIconModule } from '@angular/material/icon';
import type { ColDef } from 'ag-grid-community';
import { isDesignOpen, type RoundDetail, type TestItem } from '@ringlet/shared/contracts/rounds';
import { actionsColumnWhile } from '../../grid/columns';
import type { RowAction } from '../../grid/action-cell';
import { openDeskDialog } from '../desk-dialog/desk-dialog';
import { ItemDialog, type ItemDialogData } from '../item-dialog/item-dialog';
import { openDialog } from '../../shared/open-dialog';
import { SectionGrid } from '../../shared/section-grid';
import { RoundsService } from '../rounds-service';

/** A round's test items: the grid, and adding, editing and removing while the design is open. */
@Component({
  selector: 'app-round-items',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [SectionGrid, MatButtonModule, MatIconModule],
  templateUrl: './round-items.html',
  styleUrl: '../desk-sections.scss',
})
export class RoundItems {
  readonly round = input.required<RoundDetail>();
  /** Emitted after an item was added, changed or removed. */
  readonly changed = output<void>();
  private readonly api = inject(RoundsService);
  private readonly dialog = inject(MatDialog);
  protected readonly designOpen = computed(() => isDesignOpen(this.round().state));

  private readonly actions: RowAction<TestItem>[] = [
    { label: 'Edit', ariaLabel: (i) => `Edit item ${i.code}`, run: (i) => this.editItem(i) },
    { label: 'Remove', ariaLabel: (i) => `Remove item ${i.code}`, run: (i) => this.removeItem(i) },
  ];
  protected readonly columns = computed<ColDef<TestItem>[]>(() => [
    { field: 'code', headerName: 'Item', width: 90 },
    { field: 'material', headerName: 'Material', flex: 1, minWidth: 180 },
    { field: 'nominalSizeNm', headerName: 'Nominal size (nm)', width: 160, type: 'rightAligned' },
    { field: 'storageNotes', headerName: 'Storage', flex: 1 },
    { field: 'handlingNotes', headerName: 'Handling', flex: 1 },
    ...actionsColumnWhile(this.designOpen(), this.actions, 180),
  ]);

  /** Add a test item (no argument) or edit one. */
  protected editItem(item?: TestItem): void {
    const data: ItemDialogData = { roundId: this.round().id, item };
    openDialog(this.dialog, ItemDialog, data, '560px', () => this.changed.emit());
  }

  private removeItem(item: TestItem): void {
    openDeskDialog(
      this.dialog,
      {
        kind: 'confirm',
        title: `Remove test item ${item.code}?`,
        intro: `${item.code} · ${item.material}`,
        confirmLabel: `Remove item ${item.code}`,
        send: () => this.api.deleteItem(this.round().id, item.id),
      },
      () => this.changed.emit(),
    );
  }
}
