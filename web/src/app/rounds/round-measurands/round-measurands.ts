import {
  ChangeDetectionStrategy,
  Component,
  computed,
  inject,
  input,
  output,
  signal,
} from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatDialog } from '@angular/material/dialog';
import { MatIconModule } from '@angular/material/icon';
import type { ColDef } from 'ag-grid-community';
import {
  DLS_DEFAULT_MEASURANDS,
  isDesignOpen,
  type Measurand,
  type RoundDetail,
} from '@ringlet/shared/contracts/rounds';
import { problemMessage } from '../../core/problem';
import type { RowAction } from '../../grid/action-cell';
import { actionsColumnWhile } from '../../grid/columns';
import { openDeskDialog } from '../desk-dialog/desk-dialog';
import { MeasurandDialog, type MeasurandDialogData } from '../measurand-dialog/measurand-dialog';
import { openDialog } from '../../shared/open-dialog';
import { SectionGrid } from '../../shared/section-grid';
import { RoundsService } from '../rounds-service';
import { lacksDlsDefaults, MEASURAND_COLUMNS } from './measurand-columns';

/** A round's measurands with their σ_pt and assigned-value rules. */
@Component({
  selector: 'app-round-measurands',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [SectionGrid, MatButtonModule, MatIconModule],
  templateUrl: './round-measurands.html',
  styleUrl: '../desk-sections.scss',
})
export class RoundMeasurands {
  readonly round = input.required<RoundDetail>();
  /** Emitted after a measurand was added, changed or removed. */
  readonly changed = output<void>();
  private readonly api = inject(RoundsService);
  private readonly dialog = inject(MatDialog);
  protected readonly busy = signal(false);
  protected readonly message = signal<string | null>(null);
  protected readonly designOpen = computed(() => isDesignOpen(this.round().state));
  protected readonly lacksDlsDefaults = computed(() => lacksDlsDefaults(this.round().measurands));

  private readonly actions: RowAction<Measurand>[] = [
    {
      label: 'Edit',
      ariaLabel: (m) => `Edit measurand ${m.name}`,
      run: (m) => this.editMeasurand(m),
    },
    {
      label: 'Remove',
      ariaLabel: (m) => `Remove measurand ${m.name}`,
      run: (m) => this.removeMeasurand(m),
    },
  ];
  protected readonly columns = computed<ColDef<Measurand>[]>(() => [
    ...MEASURAND_COLUMNS,
    ...actionsColumnWhile(this.designOpen(), this.actions, 180),
  ]);

  /** Add a measurand (no argument) or edit one with its σ_pt and assigned-value rules. */
  protected editMeasurand(measurand?: Measurand): void {
    const data: MeasurandDialogData = {
      roundId: this.round().id,
      schemeId: this.round().schemeId,
      measurand,
    };
    openDialog(this.dialog, MeasurandDialog, data, '720px', () => this.changed.emit());
  }

  private removeMeasurand(m: Measurand): void {
    openDeskDialog(
      this.dialog,
      {
        kind: 'confirm',
        title: `Remove measurand ${m.name}?`,
        confirmLabel: `Remove ${m.name}`,
        send: () => this.api.deleteMeasurand(this.round().id, m.id),
      },
      () => this.changed.emit(),
    );
  }

  protected addDlsDefaults(): void {
    this.message.set(null);
    this.busy.set(true);
    this.api.addMeasurands(this.round().id, [...DLS_DEFAULT_MEASURANDS]).subscribe({
      next: () => {
        this.busy.set(false);
        this.changed.emit();
      },
      error: (e: unknown) => {
        this.busy.set(false);
        this.message.set(problemMessage(e));
      },
    });
  }
}
