import { ChangeDetectionStrategy, Component, type OnInit, inject, signal } from '@angular/core';
import { FormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatDialog } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import type { ColDef } from 'ag-grid-community';
import type { Organisation, User } from '@ringlet/shared/contracts/admin';
import { ActionCell, type RowAction } from '../grid/action-cell';
import { PageGrid } from '../shared/page-grid';
import { formatDateTime } from './admin-grid';
import { AdminService } from './admin-service';
import { EditUserDialog } from './edit-user-dialog';
import { InviteUserDialog, type InviteUserData } from './invite-user-dialog';
import { GLOBAL_ROLE_LABELS } from './role-labels';

@Component({
  selector: 'app-users',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [
    FormsModule,
    MatButtonModule,
    MatIconModule,
    MatFormFieldModule,
    MatInputModule,
    PageGrid,
  ],
  template: `
    <section class="page">
      <h1 data-testid="page-heading">Users</h1>
      <div class="page-actions">
        <button mat-flat-button type="button" data-testid="invite-user" (click)="invite()">
          <mat-icon>person_add</mat-icon> Invite user
        </button>
        <mat-form-field subscriptSizing="dynamic" class="filter">
          <mat-label>Filter</mat-label>
          <input matInput [ngModel]="filter()" (ngModelChange)="filter.set($event)" />
        </mat-form-field>
      </div>
      <app-page-grid
        [rows]="users()"
        [columns]="columns"
        [quickFilter]="filter()"
        [loading]="loading()"
        noRowsText="No users yet."
        label="Users"
      />
    </section>
  `,
  styles: `
    .filter {
      width: 240px;
    }
  `,
})
export class Users implements OnInit {
  private readonly admin = inject(AdminService);
  private readonly dialog = inject(MatDialog);
  protected readonly users = signal<User[]>([]);
  protected readonly labs = signal<Organisation[]>([]);
  protected readonly loading = signal(true);
  protected readonly filter = signal('');

  private readonly actions: RowAction<User>[] = [
    { label: 'Edit', ariaLabel: (user) => `Edit ${user.name}`, run: (user) => this.edit(user) },
  ];

  protected readonly columns: ColDef<User>[] = [
    {
      field: 'name',
      headerName: 'Name',
      flex: 1,
      minWidth: 160,
      filter: 'agTextColumnFilter',
      sort: 'asc',
    },
    { field: 'email', headerName: 'E-mail', flex: 1, minWidth: 200, filter: 'agTextColumnFilter' },
    {
      colId: 'roles',
      headerName: 'Roles',
      minWidth: 160,
      valueGetter: ({ data }) =>
        data?.roles.map((role) => GLOBAL_ROLE_LABELS[role] ?? role).join(', ') ?? '',
    },
    {
      colId: 'labs',
      headerName: 'Labs',
      flex: 1,
      minWidth: 160,
      valueGetter: ({ data }) =>
        data?.memberships
          .map((m) => (m.isManager ? `${m.organisationName} (manager)` : m.organisationName))
          .join(', ') ?? '',
    },
    {
      colId: 'status',
      headerName: 'Status',
      width: 140,
      valueGetter: ({ data }) => statusOf(data),
    },
    {
      field: 'lastSignInAt',
      headerName: 'Last sign-in',
      width: 170,
      valueFormatter: ({ value }) => formatDateTime(value as string | null),
    },
    {
      colId: 'actions',
      headerName: '',
      width: 100,
      sortable: false,
      cellRenderer: ActionCell,
      cellRendererParams: { actions: this.actions },
    },
  ];

  ngOnInit(): void {
    this.reload();
    this.admin
      .organisations()
      .subscribe((orgs) => this.labs.set(orgs.filter((org) => org.kind === 'lab')));
  }

  private reload(): void {
    this.loading.set(true);
    this.admin.users().subscribe({
      next: (users) => {
        this.users.set(users);
        this.loading.set(false);
      },
      error: () => this.loading.set(false),
    });
  }

  protected invite(): void {
    this.dialog
      .open<InviteUserDialog, InviteUserData, User>(InviteUserDialog, {
        data: { labs: this.labs() },
        width: '480px',
        maxWidth: '95vw',
      })
      .afterClosed()
      .subscribe((user) => {
        if (user) this.users.update((users) => [...users, user]);
      });
  }

  private edit(user: User): void {
    this.dialog
      .open<EditUserDialog, User, User>(EditUserDialog, {
        data: user,
        width: '480px',
        maxWidth: '95vw',
      })
      .afterClosed()
      .subscribe((updated) => {
        if (updated)
          this.users.update((users) => users.map((u) => (u.id === updated.id ? updated : u)));
      });
  }
}

/** Account state in words. */
export function statusOf(user: User | undefined): string {
  if (!user) return '';
  if (!user.isActive) return 'Inactive';
  return user.hasPassword ? 'Active' : 'Invited';
}
