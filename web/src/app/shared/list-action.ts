import { ChangeDetectionStrategy, Component, input, output } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';

/**
 * A text button that acts on one entry of a list or table (Remove, Withdraw, Revoke, Decide),
 * named for screen readers by the entry it acts on; `stroked` for the entry's main step.
 */
@Component({
  selector: 'app-list-action',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatButtonModule],
  template: `
    <button
      [matButton]="stroked() ? 'outlined' : 'text'"
      type="button"
      (click)="act.emit()"
      [attr.aria-label]="ariaLabel()"
      [attr.data-testid]="testId()"
    >
      {{ label() }}
    </button>
  `,
})
export class ListAction {
  readonly label = input.required<string>();
  readonly ariaLabel = input.required<string>();
  readonly testId = input<string | null>(null);
  readonly stroked = input(false);
  readonly act = output<void>();
}
