import {
  ChangeDetectionStrategy,
  Component,
  computed,
  effect,
  inject,
  input,
  signal,
  untracked,
} from '@angular/core';
import { MatDialog } from '@angular/material/dialog';
import type { ColDef } from 'ag-grid-community';
import type { Enrolment, RoundDetail } from '@ringlet/shared/contracts/rounds';
import { DISPATCH_CAUTIONS } from '@ringlet/shared/contracts/safety';
import type { RowAction } from '../../grid/action-cell';
import { actionsColumn } from '../../grid/columns';
import { openDeskDialog } from '../desk-dialog/desk-dialog';
import { SectionGrid } from '../../shared/section-grid';
import { RoundsService } from '../rounds-service';
import { ENROLMENT_COLUMNS, receiptSummary } from './enrolment-columns';

/** The enrolled labs with the receipt of their test items: dispatch, extension, withdrawal. */
@Component({
  selector: 'app-round-enrolments',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [SectionGrid],
  templateUrl: './round-enrolments.html',
  styleUrl: '../desk-sections.scss',
})
export class RoundEnrolments {
  readonly round = input.required<RoundDetail>();
  private readonly api = inject(RoundsService);
  private readonly dialog = inject(MatDialog);
  protected readonly enrolments = signal<Enrolment[]>([]);
  protected readonly summary = computed(() => receiptSummary(this.enrolments()));

  private readonly actions: RowAction<Enrolment>[] = [
    {
      label: 'Dispatch',
      ariaLabel: (e) => `Record dispatch to ${e.participantCode}`,
      run: (e) => this.dispatch(e),
    },
    {
      label: 'Extend',
      ariaLabel: (e) => `Grant ${e.participantCode} an extension`,
      run: (e) => this.extend(e),
    },
    {
      label: 'Withdraw',
      ariaLabel: (e) => `Withdraw ${e.participantCode}`,
      run: (e) => this.withdraw(e),
    },
  ];
  protected readonly columns: ColDef<Enrolment>[] = [
    ...ENROLMENT_COLUMNS,
    actionsColumn(this.actions, 260, { headerName: 'Actions', pinned: 'right' }),
  ];

  constructor() {
    effect(() => {
      const id = this.round().id;
      untracked(() => this.api.enrolments(id).subscribe((e) => this.enrolments.set(e)));
    });
  }

  private readonly replace = (e: Enrolment) =>
    this.enrolments.update((list) => list.map((x) => (x.id === e.id ? e : x)));

  private dispatch(e: Enrolment): void {
    openDeskDialog(
      this.dialog,
      {
        kind: 'dispatch',
        title: `Dispatch to ${e.participantCode}`,
        intro: 'The lab is e-mailed the courier and tracking number, with the handling cautions.',
        cautions: DISPATCH_CAUTIONS,
        send: (v) => this.api.dispatch(this.round().id, e.id, v),
      },
      this.replace,
    );
  }
  private extend(e: Enrolment): void {
    openDeskDialog(
      this.dialog,
      {
        kind: 'extension',
        title: `Extension for ${e.participantCode}`,
        send: (v) => this.api.extend(this.round().id, e.id, v),
      },
      this.replace,
    );
  }
  private withdraw(e: Enrolment): void {
    openDeskDialog(
      this.dialog,
      {
        kind: 'withdrawal',
        title: `Withdraw ${e.participantCode} (${e.organisationName})`,
        send: (v) => this.api.withdraw(this.round().id, e.id, v.reason),
      },
      this.replace,
    );
  }
}
