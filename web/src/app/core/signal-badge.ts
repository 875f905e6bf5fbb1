import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import { SIGNAL_LOOKS, type Signal } from '@ringlet/shared/charts/signals';

/** ISO 13528 signal classes. */
export type SignalKind = Signal;

/** Each signal has its own colour, shape and word (shared/charts/signals.ts): never colour alone. */
export { SIGNAL_LOOKS };

/** Shows a signal as shape + word + colour, e.g. a teal circle and "Acceptable". */
@Component({
  selector: 'app-signal-badge',
  changeDetection: ChangeDetectionStrategy.OnPush,
  host: {
    class: 'signal-badge',
    '[class]': '"signal-" + signal()',
    '[attr.data-signal]': 'signal()',
  },
  template: `
    <svg
      class="shape"
      viewBox="0 0 12 12"
      width="12"
      height="12"
      aria-hidden="true"
      focusable="false"
      [attr.data-shape]="look().shape"
    >
      @switch (look().shape) {
        @case ('circle') {
          <circle cx="6" cy="6" r="5" />
        }
        @case ('triangle') {
          <polygon points="6,0.8 11.4,11 0.6,11" />
        }
        @case ('diamond') {
          <polygon points="6,0.4 11.6,6 6,11.6 0.4,6" />
        }
      }
    </svg>
    <span class="word">{{ label() ?? look().word }}</span>
  `,
  styles: `
    :host {
      display: inline-flex;
      align-items: center;
      gap: 4px;
      font-weight: 500;
      white-space: nowrap;
      color: var(--rl-signal-color);
    }
    :host(.signal-acceptable) {
      --rl-signal-color: var(--rl-signal-acceptable);
    }
    :host(.signal-warning) {
      --rl-signal-color: var(--rl-signal-warning);
    }
    :host(.signal-action) {
      --rl-signal-color: var(--rl-signal-action);
    }
    .shape {
      fill: currentColor;
      flex: none;
    }
  `,
})
export class SignalBadge {
  readonly signal = input.required<SignalKind>();
  /** Optional wording instead of the default word (e.g. "Warning signal"). */
  readonly label = input<string>();
  protected readonly look = computed(() => SIGNAL_LOOKS[this.signal()]);
}
