import { ChangeDetectionStrategy, Component, type OnInit, inject, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatDialog } from '@angular/material/dialog';
import { MatIconModule } from '@angular/material/icon';
import { Router } from '@angular/router';
import type { ColDef } from 'ag-grid-community';
import {
  ROUND_KIND_LABELS,
  type RoundSummary,
  type Scheme,
} from '@ringlet/shared/contracts/rounds';
import { ROUND_STATE_LABELS } from '@ringlet/shared/contracts/round-states';
import type { RowAction } from '../grid/action-cell';
import { actionsColumn } from '../grid/columns';
import { openDialog } from '../shared/open-dialog';
import { PageGrid } from '../shared/page-grid';
import { RoundDialog, type RoundDialogData } from './round-dialog/round-dialog';
import { formatDate, formatMoney } from './rounds-grid';
import { RoundsService } from './rounds-service';
import { SchemeDialog } from './scheme-dialog/scheme-dialog';

/** The coordinator's workspace: every round in one grid, and the way to start new ones. */
@Component({
  selector: 'app-round-desk',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatButtonModule, MatIconModule, PageGrid],
  template: `
    <section class="page">
      <h1 data-testid="page-heading">Round desk</h1>
      <div class="page-actions">
        <button mat-stroked-button type="button" data-testid="new-scheme" (click)="newScheme()">
          <mat-icon>add</mat-icon> New scheme
        </button>
        <button
          mat-flat-button
          type="button"
          data-testid="new-round"
          (click)="newRound()"
          [disabled]="schemes().length === 0"
        >
          <mat-icon>add</mat-icon> New round
        </button>
        @if (schemes().length === 0 && !loading()) {
          <span>Create a scheme first; rounds belong to a scheme.</span>
        }
      </div>
      <app-page-grid [rows]="rounds()" [columns]="columns" [loading]="loading()" label="Rounds" />
    </section>
  `,
})
export class RoundDesk implements OnInit {
  private readonly api = inject(RoundsService);
  private readonly dialog = inject(MatDialog);
  private readonly router = inject(Router);
  protected readonly rounds = signal<RoundSummary[]>([]);
  protected readonly schemes = signal<Scheme[]>([]);
  protected readonly loading = signal(true);

  private readonly actions: RowAction<RoundSummary>[] = [
    {
      label: 'Open',
      ariaLabel: (r) => `Open round ${r.code}`,
      run: (r) => void this.router.navigate(['/desk/rounds', r.id]),
    },
  ];

  protected readonly columns: ColDef<RoundSummary>[] = [
    { field: 'code', headerName: 'Round', width: 150, filter: 'agTextColumnFilter' },
    { field: 'title', headerName: 'Title', flex: 1, minWidth: 200, filter: 'agTextColumnFilter' },
    {
      field: 'kind',
      headerName: 'Kind',
      width: 140,
      valueFormatter: ({ value }) => ROUND_KIND_LABELS[value as RoundSummary['kind']],
    },
    { field: 'schemeCode', headerName: 'Scheme', width: 130 },
    {
      field: 'state',
      headerName: 'State',
      width: 120,
      valueFormatter: ({ value }) => ROUND_STATE_LABELS[value as RoundSummary['state']],
    },
    { field: 'itemCount', headerName: 'Items', width: 90, type: 'rightAligned' },
    { field: 'enrolledCount', headerName: 'Enrolled labs', width: 130, type: 'rightAligned' },
    {
      field: 'resultsDueAt',
      headerName: 'Results due',
      width: 170,
      valueFormatter: ({ value }) => formatDate(value as string, true),
    },
    {
      colId: 'fee',
      headerName: 'Fee',
      width: 120,
      type: 'rightAligned',
      valueGetter: ({ data }) => (data ? formatMoney(data.feeMinor, data.currency) : ''),
    },
    actionsColumn(this.actions, 110),
  ];

  ngOnInit(): void {
    this.api.schemes().subscribe((s) => this.schemes.set(s));
    this.api.rounds().subscribe({
      next: (r) => {
        this.rounds.set(r);
        this.loading.set(false);
      },
      error: () => this.loading.set(false),
    });
  }

  protected newScheme(): void {
    openDialog(this.dialog, SchemeDialog, undefined, '520px', (s: Scheme) =>
      this.schemes.update((list) => [...list, s]),
    );
  }

  protected newRound(): void {
    const data: RoundDialogData = { schemes: this.schemes() };
    openDialog(this.dialog, RoundDialog, data, '760px', (id: string) => {
      void this.router.navigate(['/desk/rounds', id]);
    });
  }
}
