import { ChangeDetectionStrategy, Component, input, output } from '@angular/core';
import { ClassBadge } from './class-badge';
import { testNames, type PendingCell } from './precision-view';
import { ListAction } from '../shared/list-action';

/** The cells Cochran or Grubbs flagged that wait for the coordinator's decision. */
@Component({
  selector: 'app-precision-pending',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [ListAction, ClassBadge],
  templateUrl: './pending-list.html',
  styleUrl: './precision.scss',
})
export class PendingList {
  readonly cells = input.required<readonly PendingCell[]>();
  /** Decisions can be recorded (the round is closed). */
  readonly open = input.required<boolean>();
  readonly decide = output<PendingCell>();
  protected readonly testNames = testNames;
}
