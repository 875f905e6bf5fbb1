import {
  ChangeDetectionStrategy,
  Component,
  type OnInit,
  computed,
  inject,
  input,
} from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatDialog } from '@angular/material/dialog';
import { MatIconModule } from '@angular/material/icon';
import { RouterLink } from '@angular/router';
import {
  isDescriptionOpen,
  type RoundDetail as RoundDetailDto,
  type TransitionRequest,
} from '@ringlet/shared/contracts/rounds';
import {
  describeMove,
  ROUND_STATE_LABELS,
  type RoundState,
} from '@ringlet/shared/contracts/round-states';
import { SignalBadge } from '../../core/signal-badge';
import { openDialog } from '../../shared/open-dialog';
import { PageLoad } from '../../shared/page-load';
import { openDeskDialog } from '../desk-dialog/desk-dialog';
import { RoundEditDialog } from '../round-edit-dialog/round-edit-dialog';
import { RoundEnrolments } from '../round-enrolments/round-enrolments';
import { RoundInvitations } from '../round-invitations/round-invitations';
import { RoundItems } from '../round-items/round-items';
import { RoundMeasurands } from '../round-measurands/round-measurands';
import { RoundStudies } from '../round-studies/round-studies';
import { formatDate, formatMoney } from '../rounds-grid';
import { RoundsService } from '../rounds-service';
import { deskMoves, evaluatedElsewhere, transitionAsk } from './round-moves';
import { PrecisionStudyLink } from '../../precision/precision-study-link';

/**
 * One round on the Round desk: its state and moves, instructions and history; the sections
 * (items, measurands, invitations, enrolments, homogeneity) are components of their own.
 */
@Component({
  selector: 'app-round-detail',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [
    MatButtonModule,
    MatIconModule,
    RouterLink,
    SignalBadge,
    RoundItems,
    RoundMeasurands,
    RoundInvitations,
    RoundEnrolments,
    RoundStudies,
    PrecisionStudyLink,
  ],
  templateUrl: './round-detail.html',
  styleUrl: './round-detail.scss',
})
export class RoundDetail implements OnInit {
  /** Route parameter (component input binding). */
  readonly id = input.required<string>();
  private readonly api = inject(RoundsService);
  private readonly dialog = inject(MatDialog);
  protected readonly formatDate = formatDate;
  protected readonly formatMoney = formatMoney;
  protected readonly stateLabel = (s: RoundState) => ROUND_STATE_LABELS[s];
  protected readonly moveOf = describeMove;
  private readonly page = new PageLoad(() => this.api.round(this.id()));
  protected readonly round = this.page.value;
  protected readonly descriptionOpen = computed(() => {
    const r = this.round();
    return !!r && isDescriptionOpen(r.state);
  });
  protected readonly nextStates = computed(() => {
    const r = this.round();
    return r ? deskMoves(r.state) : [];
  });
  protected readonly evaluationElsewhere = computed(() => {
    const r = this.round();
    return !!r && r.kind === 'pt' && evaluatedElsewhere(r.state);
  });

  ngOnInit(): void {
    this.reload();
  }

  /** Reads the round again; its sections read their own lists when the round changes. */
  protected reload(): void {
    this.page.load();
  }

  protected move(to: RoundState): void {
    const r = this.round()!;
    openDeskDialog(
      this.dialog,
      {
        ...transitionAsk(r, to, Date.now()),
        send: (v: TransitionRequest) => this.api.transition(r.id, v),
      },
      (updated) => {
        this.round.set(updated);
        this.reload();
      },
    );
  }

  protected editRound(): void {
    const r = this.round();
    if (!r) return;
    openDialog(this.dialog, RoundEditDialog, r, '720px', (updated: RoundDetailDto) =>
      this.round.set(updated),
    );
  }
}
