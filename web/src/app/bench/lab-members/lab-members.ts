import {
  ChangeDetectionStrategy,
  Component,
  computed,
  effect,
  inject,
  signal,
} from '@angular/core';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatSelectModule } from '@angular/material/select';
import type {
  LabInvitation,
  LabMemberInviteResult,
  Membership,
} from '@ringlet/shared/contracts/admin';
import { AuthService } from '../../core/auth-service';
import { MembersTable } from '../../shared/members-table';
import { AssessorGrants } from './assessor-grants/assessor-grants';
import { InviteColleague } from './invite-colleague/invite-colleague';
import { LabMembersService } from './lab-members-service';
import { ListAction } from '../../shared/list-action';

/** The pending list once an invitation is sent: the new one first, an earlier one to the same person replaced. */
export function withInvitation(
  list: readonly LabInvitation[],
  invitation: LabInvitation,
): LabInvitation[] {
  return [invitation, ...list.filter((i) => i.id !== invitation.id)];
}

/** For lab managers: who belongs to the lab, invite a colleague, remove one; assessor access. */
@Component({
  selector: 'app-lab-members',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [
    MembersTable,
    ListAction,
    MatFormFieldModule,
    MatSelectModule,
    InviteColleague,
    AssessorGrants,
  ],
  templateUrl: './lab-members.html',
  styles: `
    app-members-table {
      display: block;
      margin-bottom: 8px;
    }
    .pending {
      padding-left: 18px;
    }
  `,
})
export class LabMembers {
  private readonly auth = inject(AuthService);
  private readonly service = inject(LabMembersService);

  protected readonly labs = this.auth.managedLabs;
  protected readonly myId = computed(() => this.auth.me()?.id);
  protected readonly labId = signal<string | null>(
    this.auth.managedLabs()[0]?.organisationId ?? null,
  );
  protected readonly labName = computed(
    () => this.labs().find((lab) => lab.organisationId === this.labId())?.organisationName ?? null,
  );
  protected readonly members = signal<Membership[]>([]);
  protected readonly invitations = signal<LabInvitation[]>([]);

  constructor() {
    effect(() => {
      const labId = this.labId();
      this.members.set([]);
      this.invitations.set([]);
      if (labId) {
        this.service.members(labId).subscribe((members) => this.members.set(members));
        this.service
          .invitations(labId)
          .subscribe((invitations) => this.invitations.set(invitations));
      }
    });
  }

  protected invited({ membership, invitation }: LabMemberInviteResult): void {
    if (membership) this.members.update((members) => [...members, membership]);
    if (invitation) this.invitations.update((list) => withInvitation(list, invitation));
  }

  protected withdraw(invitation: LabInvitation): void {
    const labId = this.labId();
    if (!labId) return;
    this.service
      .withdrawInvitation(labId, invitation.id)
      .subscribe(() =>
        this.invitations.update((list) => list.filter((i) => i.id !== invitation.id)),
      );
  }

  protected remove(membership: Membership): void {
    const labId = this.labId();
    if (!labId) return;
    this.service
      .remove(labId, membership.id)
      .subscribe(() =>
        this.members.update((members) => members.filter((m) => m.id !== membership.id)),
      );
  }
}
