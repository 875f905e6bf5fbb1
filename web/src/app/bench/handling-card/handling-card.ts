import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import type { MyRoundDetail } from '@ringlet/shared/contracts/bench';
import { SHARPS_CAUTIONS } from '@ringlet/shared/contracts/safety';
import type { SubmissionData } from '@ringlet/shared/contracts/submission';
import { usesSharps } from './sharps';

/** A round's handling instructions: the safety cautions first, then the test items and their notes. */
@Component({
  selector: 'app-handling-card',
  changeDetection: ChangeDetectionStrategy.OnPush,
  templateUrl: './handling-card.html',
  styleUrl: '../bench-round/bench-round.scss',
})
export class HandlingCard {
  readonly round = input.required<MyRoundDetail>();
  readonly data = input<SubmissionData | null>(null);
  protected readonly sharpsCautions = SHARPS_CAUTIONS;
  protected readonly usesSharps = computed(() => usesSharps(this.round(), this.data()));
}
