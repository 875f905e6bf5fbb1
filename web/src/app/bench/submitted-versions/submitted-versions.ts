import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, input } from '@angular/core';
import type { SubmissionVersionDto } from '@ringlet/shared/contracts/bench';

/** The lab's submitted versions of its results for a round, newest first. */
@Component({
  selector: 'app-submitted-versions',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [DatePipe],
  templateUrl: './submitted-versions.html',
  styleUrl: '../bench-round/bench-round.scss',
})
export class SubmittedVersions {
  readonly versions = input.required<readonly SubmissionVersionDto[]>();
}
