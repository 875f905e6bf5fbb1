import {
  ChangeDetectionStrategy,
  Component,
  type OnInit,
  computed,
  inject,
  input,
  signal,
} from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatCheckboxModule } from '@angular/material/checkbox';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatSelectModule } from '@angular/material/select';
import { RouterLink } from '@angular/router';
import type { Membership, Organisation, User } from '@ringlet/shared/contracts/admin';
import { MembersTable } from '../shared/members-table';
import { AdminService } from './admin-service';

/** One lab's members: add, remove, and toggle who manages the lab. */
@Component({
  selector: 'app-lab-memberships',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [
    ReactiveFormsModule,
    RouterLink,
    MembersTable,
    MatButtonModule,
    MatFormFieldModule,
    MatSelectModule,
    MatCheckboxModule,
  ],
  template: `
    <section class="page">
      <p><a routerLink="/admin/labs">← Labs</a></p>
      <h1 data-testid="page-heading">Members of {{ lab()?.name ?? 'the lab' }}</h1>
      <app-members-table
        [members]="members()"
        label="Members"
        manager="toggle"
        emptyText="No members yet."
        (remove)="remove($event)"
        (managerChange)="setManager($event.membership, $event.isManager)"
      />

      <h2>Add a member</h2>
      <form [formGroup]="form" (ngSubmit)="add()" class="add" novalidate>
        <mat-form-field>
          <mat-label>User</mat-label>
          <mat-select formControlName="userId" required>
            @for (user of candidates(); track user.id) {
              <mat-option [value]="user.id">{{ user.name }} ({{ user.email }})</mat-option>
            }
          </mat-select>
          <mat-error>Choose a user.</mat-error>
        </mat-form-field>
        <mat-checkbox formControlName="isManager">Manager</mat-checkbox>
        <button mat-flat-button type="submit">Add</button>
      </form>
    </section>
  `,
  styles: `
    .add {
      display: flex;
      flex-wrap: wrap;
      gap: 12px;
      align-items: center;
    }
    .add mat-form-field {
      min-width: 320px;
    }
  `,
})
export class LabMemberships implements OnInit {
  private readonly admin = inject(AdminService);
  /** Organisation id (route parameter). */
  readonly id = input.required<string>();

  protected readonly lab = signal<Organisation | null>(null);
  protected readonly members = signal<Membership[]>([]);
  protected readonly users = signal<User[]>([]);
  protected readonly candidates = computed(() => {
    const memberIds = new Set(this.members().map((m) => m.userId));
    return this.users().filter((user) => !memberIds.has(user.id));
  });
  protected readonly form = inject(NonNullableFormBuilder).group({
    userId: ['', [Validators.required]],
    isManager: [false],
  });

  ngOnInit(): void {
    this.admin
      .organisations()
      .subscribe((orgs) => this.lab.set(orgs.find((o) => o.id === this.id()) ?? null));
    this.admin.memberships(this.id()).subscribe((members) => this.members.set(members));
    this.admin.users().subscribe((users) => this.users.set(users));
  }

  protected add(): void {
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      return;
    }
    const { userId, isManager } = this.form.getRawValue();
    this.admin
      .addMembership({ userId, organisationId: this.id(), isManager })
      .subscribe((membership) => {
        this.members.update((members) => [...members, membership]);
        this.form.reset({ userId: '', isManager: false });
      });
  }

  protected setManager(membership: Membership, isManager: boolean): void {
    this.admin.setManager(membership.id, isManager).subscribe({
      next: (updated) =>
        this.members.update((ms) => ms.map((m) => (m.id === updated.id ? updated : m))),
      // Put the toggle back as the server has it.
      error: () => this.members.update((ms) => [...ms]),
    });
  }

  protected remove(membership: Membership): void {
    this.admin
      .removeMembership(membership.id)
      .subscribe(() => this.members.update((ms) => ms.filter((m) => m.id !== membership.id)));
  }
}
