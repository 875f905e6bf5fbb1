import { ChangeDetectionStrategy, Component, input } from '@angular/core';
import { type FormControl, ReactiveFormsModule } from '@angular/forms';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';
import type { GlobalRole } from '@ringlet/shared/contracts/auth';
import { GLOBAL_ROLE_LABELS, GLOBAL_ROLES } from '../admin/role-labels';
import { errorMessage } from '../core/zod-form-errors';

/**
 * A user's "Name" and "Roles" fields (inviting and editing a user). The parent owns the controls,
 * so its form checks and submits them and a server issue lands under its field.
 */
@Component({
  selector: 'app-user-fields',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [ReactiveFormsModule, MatFormFieldModule, MatInputModule, MatSelectModule],
  host: { style: 'display: contents' },
  template: `
    <mat-form-field>
      <mat-label>Name</mat-label>
      <input matInput [formControl]="name()" required />
      <mat-error>{{ errorMessage(name()) }}</mat-error>
    </mat-form-field>
    <mat-form-field>
      <mat-label>Roles</mat-label>
      <mat-select [formControl]="roles()" multiple>
        @for (role of allRoles; track role) {
          <mat-option [value]="role">{{ roleLabels[role] }}</mat-option>
        }
      </mat-select>
      @if (rolesHint(); as hint) {
        <mat-hint>{{ hint }}</mat-hint>
      }
      <mat-error>{{ errorMessage(roles()) }}</mat-error>
    </mat-form-field>
  `,
})
export class UserFields {
  readonly name = input.required<FormControl<string>>();
  readonly roles = input.required<FormControl<GlobalRole[]>>();
  /** A line under the roles (e.g. what no role means). */
  readonly rolesHint = input('');
  protected readonly allRoles = GLOBAL_ROLES;
  protected readonly roleLabels = GLOBAL_ROLE_LABELS;
  protected readonly errorMessage = errorMessage;
}
