import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';

/** ISO 13528 signal classes. */
export type SignalKind = 'acceptable' | 'warning' | 'action';

interface SignalLook {
  readonly word: string;
  readonly shape: 'circle' | 'triangle' | 'diamond';
}

/** Each signal has its own colour, shape and word: never colour alone. */
export const SIGNAL_LOOKS: Readonly<Record<SignalKind, SignalLook>> = {
  acceptable: { word: 'Acceptable', shape: 'circle' },
  warning: { word: 'Warning', shape: 'triangle' },
  action: { word: 'Action', shape: 'diamond' },
};

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
      --rl-signal-color: var(--rl-signal-acceptable, #1b7f79);
    }
    :host(.signal-warning) {
      --rl-signal-color: var(--rl-signal-warning, #b7791f);
    }
    :host(.signal-action) {
      --rl-signal-color: var(--rl-signal-action, #a4262c);
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
