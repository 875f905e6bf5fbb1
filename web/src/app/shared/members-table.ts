import { ChangeDetectionStrategy, Component, computed, input, output } from '@angular/core';
import { MatSlideToggleModule } from '@angular/material/slide-toggle';
import { MatTableModule } from '@angular/material/table';
import type { Membership } from '@ringlet/shared/contracts/admin';
import { ListAction } from './list-action';

/** A change of who manages a lab, asked from the members table. */
export interface ManagerChange {
  membership: Membership;
  isManager: boolean;
}

/**
 * One lab's members (name, e-mail, whether they manage the lab) with a Remove action, for the lab
 * manager's own page and the admin's. `manager="toggle"` shows the manager column as a switch
 * that asks for the change; `keep` names the member who cannot be removed here (oneself).
 */
@Component({
  selector: 'app-members-table',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatTableModule, MatSlideToggleModule, ListAction],
  template: `
    <table mat-table [dataSource]="members()" [attr.aria-label]="label()" class="members">
      <ng-container matColumnDef="name">
        <th mat-header-cell *matHeaderCellDef>Name</th>
        <td mat-cell *matCellDef="let m">{{ m.userName }}</td>
      </ng-container>
      <ng-container matColumnDef="email">
        <th mat-header-cell *matHeaderCellDef>E-mail</th>
        <td mat-cell *matCellDef="let m">{{ m.userEmail }}</td>
      </ng-container>
      <ng-container matColumnDef="role">
        <th mat-header-cell *matHeaderCellDef>Role in the lab</th>
        <td mat-cell *matCellDef="let m">{{ m.isManager ? 'Manager' : 'Member' }}</td>
      </ng-container>
      <ng-container matColumnDef="manager">
        <th mat-header-cell *matHeaderCellDef>Manager</th>
        <td mat-cell *matCellDef="let m">
          <mat-slide-toggle
            [checked]="m.isManager"
            (change)="managerChange.emit({ membership: m, isManager: $event.checked })"
            [aria-label]="'Manager: ' + m.userName"
          />
        </td>
      </ng-container>
      <ng-container matColumnDef="actions">
        <th mat-header-cell *matHeaderCellDef><span class="visually-hidden">Actions</span></th>
        <td mat-cell *matCellDef="let m">
          @if (m.userId !== keep()) {
            <app-list-action
              label="Remove"
              [ariaLabel]="'Remove ' + m.userName"
              (act)="remove.emit(m)"
            />
          }
        </td>
      </ng-container>
      <tr mat-header-row *matHeaderRowDef="columns()"></tr>
      <tr mat-row *matRowDef="let row; columns: columns()"></tr>
      @if (emptyText(); as empty) {
        <tr class="mat-mdc-row" *matNoDataRow>
          <td class="mat-mdc-cell" [attr.colspan]="columns().length">{{ empty }}</td>
        </tr>
      }
    </table>
  `,
  styles: `
    .members {
      max-width: 900px;
    }
  `,
})
export class MembersTable {
  readonly members = input.required<readonly Membership[]>();
  /** The table's accessible name. */
  readonly label = input.required<string>();
  /** 'text': the role in words; 'toggle': a switch that asks to change who manages. */
  readonly manager = input<'text' | 'toggle'>('text');
  /** The user id of the member who cannot be removed here. */
  readonly keep = input<string | null | undefined>(null);
  /** What the table says when the lab has no member (none: an empty table). */
  readonly emptyText = input<string | null>(null);
  readonly remove = output<Membership>();
  readonly managerChange = output<ManagerChange>();
  protected readonly columns = computed(() => [
    'name',
    'email',
    this.manager() === 'toggle' ? 'manager' : 'role',
    'actions',
  ]);
}
