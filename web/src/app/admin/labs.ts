import { ChangeDetectionStrategy, Component, type OnInit, inject, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatDialog } from '@angular/material/dialog';
import { MatIconModule } from '@angular/material/icon';
import { Router } from '@angular/router';
import type { ColDef } from 'ag-grid-community';
import type { Organisation } from '@ringlet/shared/contracts/admin';
import { ActionCell, type RowAction } from '../grid/action-cell';
import { PageGrid } from '../shared/page-grid';
import { formatDateTime } from './admin-grid';
import { AdminService } from './admin-service';
import { LabDialog } from './lab-dialog';

@Component({
  selector: 'app-labs',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatButtonModule, MatIconModule, PageGrid],
  template: `
    <section class="page">
      <h1 data-testid="page-heading">Organisations</h1>
      <div class="page-actions">
        <button mat-flat-button type="button" data-testid="new-lab" (click)="create()">
          <mat-icon>add</mat-icon> New organisation
        </button>
      </div>
      <app-page-grid
        [rows]="labs()"
        [columns]="columns"
        [loading]="loading()"
        label="Organisations"
      />
    </section>
  `,
})
export class Labs implements OnInit {
  private readonly admin = inject(AdminService);
  private readonly dialog = inject(MatDialog);
  private readonly router = inject(Router);
  protected readonly labs = signal<Organisation[]>([]);
  protected readonly loading = signal(true);

  private readonly actions: RowAction<Organisation>[] = [
    { label: 'Edit', ariaLabel: (lab) => `Edit ${lab.name}`, run: (lab) => this.edit(lab) },
    {
      label: 'Members',
      ariaLabel: (lab) => `Members of ${lab.name}`,
      run: (lab) => void this.router.navigate(['/admin/labs', lab.id]),
    },
  ];

  protected readonly columns: ColDef<Organisation>[] = [
    {
      field: 'name',
      headerName: 'Name',
      flex: 1,
      minWidth: 180,
      filter: 'agTextColumnFilter',
      sort: 'asc',
    },
    {
      field: 'kind',
      headerName: 'Kind',
      width: 130,
      valueFormatter: ({ value }) => (value === 'provider' ? 'PT provider' : 'Lab'),
    },
    { field: 'country', headerName: 'Country', width: 140 },
    { field: 'contactEmail', headerName: 'Contact e-mail', flex: 1, minWidth: 180 },
    {
      field: 'createdAt',
      headerName: 'Created',
      width: 170,
      valueFormatter: ({ value }) => formatDateTime(value as string),
    },
    {
      colId: 'actions',
      headerName: '',
      width: 190,
      sortable: false,
      cellRenderer: ActionCell,
      cellRendererParams: { actions: this.actions },
    },
  ];

  ngOnInit(): void {
    this.admin.organisations().subscribe({
      next: (labs) => {
        this.labs.set(labs);
        this.loading.set(false);
      },
      error: () => this.loading.set(false),
    });
  }

  protected create(): void {
    this.dialog
      .open<LabDialog, Organisation | null, Organisation>(LabDialog, {
        data: null,
        width: '440px',
        maxWidth: '95vw',
      })
      .afterClosed()
      .subscribe((lab) => {
        if (lab) this.labs.update((labs) => [...labs, lab]);
      });
  }

  private edit(lab: Organisation): void {
    this.dialog
      .open<LabDialog, Organisation | null, Organisation>(LabDialog, {
        data: lab,
        width: '440px',
        maxWidth: '95vw',
      })
      .afterClosed()
      .subscribe((updated) => {
        if (updated)
          this.labs.update((labs) => labs.map((l) => (l.id === updated.id ? updated : l)));
      });
  }
}
