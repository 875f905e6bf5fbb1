import { ChangeDetectionStrategy, Component, input } from '@angular/core';
import { RouterLink } from '@angular/router';
import type { RoundSummary } from '@ringlet/shared/contracts/rounds';

/** On the Round desk's round page: a precision study says what it is and links to its study page. */
@Component({
  selector: 'app-precision-study-link',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [RouterLink],
  templateUrl: './precision-study-link.html',
})
export class PrecisionStudyLink {
  readonly round = input.required<Pick<RoundSummary, 'id' | 'kind'>>();
}
