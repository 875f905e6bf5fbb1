import {
  ChangeDetectionStrategy,
  Component,
  type OnInit,
  effect,
  inject,
  input,
  output,
  signal,
  untracked,
} from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';
import type { Organisation } from '@ringlet/shared/contracts/admin';
import {
  type Invitation,
  InvitationsCreate,
  type RoundDetail,
} from '@ringlet/shared/contracts/rounds';
import { errorMessage } from '../../core/zod-form-errors';
import { FormSubmit } from '../../shared/form-submit';
import { SectionGrid } from '../../shared/section-grid';
import { RoundsService } from '../rounds-service';
import { INVITATION_COLUMNS, invitationsFromRows } from './invitation-rows';

/** Inviting labs to an enrolling round (known labs or new ones by address) and the invitations sent. */
@Component({
  selector: 'app-round-invitations',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [
    SectionGrid,
    ReactiveFormsModule,
    MatButtonModule,
    MatIconModule,
    MatFormFieldModule,
    MatInputModule,
    MatSelectModule,
  ],
  templateUrl: './round-invitations.html',
  styleUrl: '../desk-sections.scss',
})
export class RoundInvitations implements OnInit {
  readonly round = input.required<RoundDetail>();
  /** Emitted after invitations were sent. */
  readonly changed = output<void>();
  private readonly api = inject(RoundsService);
  private readonly fb = inject(NonNullableFormBuilder);
  protected readonly columns = INVITATION_COLUMNS;
  protected readonly errorMessage = errorMessage;
  protected readonly labs = signal<Organisation[]>([]);
  protected readonly invitations = signal<Invitation[]>([]);
  protected readonly form = this.fb.group({ invitations: this.fb.array([this.row()]) });
  protected readonly submission = new FormSubmit(this.form);

  constructor() {
    effect(() => {
      const id = this.round().id;
      untracked(() => this.api.invitations(id).subscribe((i) => this.invitations.set(i)));
    });
  }

  ngOnInit(): void {
    this.api.labs().subscribe((l) => this.labs.set(l));
  }

  private row() {
    return this.fb.group({ organisationId: [''], labName: [''], email: [''] });
  }
  protected addInvite(): void {
    this.form.controls.invitations.push(this.row());
  }
  protected removeInvite(i: number): void {
    if (this.form.controls.invitations.length > 1) this.form.controls.invitations.removeAt(i);
  }

  protected invite(): void {
    const body = invitationsFromRows(this.form.getRawValue().invitations);
    const send = (v: InvitationsCreate) => this.api.invite(this.round().id, v.invitations);
    this.submission.submit(InvitationsCreate, body, send, () => {
      this.form.controls.invitations.clear();
      this.addInvite();
      this.changed.emit();
    });
  }
}
