import { ChangeDetectionStrategy, Component, effect, inject, input, signal } from '@angular/core';
import { MatDialog } from '@angular/material/dialog';
import { MatSnackBar } from '@angular/material/snack-bar';
import { MatTableModule } from '@angular/material/table';
import type { AssessorGrantDto } from '@ringlet/shared/contracts/evaluation';
import { GrantForm } from '../grant-form/grant-form';
import { GRANT_STATE_WORDS, type GrantState, grantState, isRevocable } from '../grant-state';
import { LabMembersService } from '../lab-members-service';
import { RevokeGrantDialog } from './revoke-grant-dialog';
import { ListAction } from '../../../shared/list-action';

/** For lab managers: which assessors may read the lab, give one access, revoke it. */
@Component({
  selector: 'app-assessor-grants',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatTableModule, ListAction, GrantForm],
  templateUrl: './assessor-grants.html',
  styles: `
    .explain {
      max-width: 72ch;
    }
    .grants {
      max-width: 900px;
      margin-bottom: 8px;
    }
    .email,
    .when {
      color: var(--mat-sys-on-surface-variant);
    }
    .state {
      font-weight: 500;
    }
    .state[data-state='active'] {
      color: var(--rl-signal-acceptable, #1b7f79);
    }
    .state[data-state='revoked'] {
      color: var(--rl-signal-action, #a4262c);
    }
  `,
})
export class AssessorGrants {
  readonly labId = input.required<string>();
  private readonly service = inject(LabMembersService);
  private readonly dialog = inject(MatDialog);
  private readonly snackBar = inject(MatSnackBar);

  protected readonly columns = ['assessor', 'from', 'until', 'state', 'actions'];
  protected readonly words = GRANT_STATE_WORDS;
  protected readonly grants = signal<AssessorGrantDto[]>([]);

  constructor() {
    effect(() => {
      this.grants.set([]);
      this.reload();
    });
  }

  protected state(g: AssessorGrantDto): GrantState {
    return grantState(g);
  }

  protected revocable(g: AssessorGrantDto): boolean {
    return isRevocable(g);
  }

  protected granted(grant: AssessorGrantDto): void {
    this.grants.update((grants) => [grant, ...grants]);
  }

  protected revoke(grant: AssessorGrantDto): void {
    this.dialog
      .open(RevokeGrantDialog, { data: grant, width: '480px' })
      .afterClosed()
      .subscribe((confirmed: unknown) => {
        if (confirmed !== true) return;
        this.service.revokeGrant(this.labId(), grant.id).subscribe(() => {
          this.snackBar.open(`Access for ${grant.assessorEmail} revoked.`, 'Close', {
            duration: 5000,
          });
          this.reload();
        });
      });
  }

  private reload(): void {
    this.service.grants(this.labId()).subscribe((grants) => this.grants.set(grants));
  }
}
