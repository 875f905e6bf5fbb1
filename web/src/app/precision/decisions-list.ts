import { ChangeDetectionStrategy, Component, input, output } from '@angular/core';
import {
  PRECISION_DECISION_LABELS,
  PRECISION_EXCLUSION_KIND_LABELS,
  type PrecisionExclusion,
} from '@ringlet/shared/contracts/precision';
import { LOCAL_ID_PREFIX } from './precision-view';
import { ListAction } from '../shared/list-action';

/** The decisions in force, newest first; those not stored yet say so. Each can be withdrawn while open. */
@Component({
  selector: 'app-precision-decisions',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [ListAction],
  templateUrl: './decisions-list.html',
  styleUrl: './precision.scss',
})
export class DecisionsList {
  readonly decisions = input.required<readonly PrecisionExclusion[]>();
  /** Measurand names by file code, and level names by item code. */
  readonly measurandLabels = input.required<Readonly<Partial<Record<string, string>>>>();
  readonly levelLabels = input.required<Readonly<Partial<Record<string, string>>>>();
  /** Whether decisions can change (the round is Closed): shows the Withdraw action. */
  readonly open = input(false);
  readonly withdraw = output<PrecisionExclusion>();
  protected readonly decisionLabels = PRECISION_DECISION_LABELS;
  protected readonly kindLabels = PRECISION_EXCLUSION_KIND_LABELS;
  protected isUnsaved(id: string): boolean {
    return id.startsWith(LOCAL_ID_PREFIX);
  }
  protected when(iso: string): string {
    const d = new Date(iso);
    return Number.isNaN(d.getTime())
      ? iso
      : d.toLocaleString(undefined, { dateStyle: 'medium', timeStyle: 'short' });
  }
}
