import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import type { PrecisionClassification } from '@ringlet/shared/contracts/precision';
import { SignalBadge } from '../core/signal-badge';
import { CLASS_SIGNAL, CLASS_WORDS } from './precision-view';

/** An ISO 5725-2 class by shape, word and colour: accepted ●, straggler ▲, outlier ◆. */
@Component({
  selector: 'app-class-badge',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [SignalBadge],
  templateUrl: './class-badge.html',
})
export class ClassBadge {
  readonly value = input.required<PrecisionClassification>();
  /** Optional text after the word, e.g. the test's name. */
  readonly suffix = input<string>('');
  protected readonly signal = computed(() => CLASS_SIGNAL[this.value()]);
  protected readonly word = computed(
    () => CLASS_WORDS[this.value()] + (this.suffix() ? ` ${this.suffix()}` : ''),
  );
}
