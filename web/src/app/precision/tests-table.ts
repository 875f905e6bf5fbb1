import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import type {
  PrecisionClassification,
  PrecisionGrubbs,
  PrecisionLevelResult,
} from '@ringlet/shared/contracts/precision';
import { ClassBadge } from './class-badge';
import { fix } from './precision-view';

interface TestRow {
  readonly name: string;
  readonly statistic: string;
  readonly value: number;
  readonly critical5: number;
  readonly critical1: number;
  /** How the statistic compares: a large value is suspicious, or (Grubbs double) a small one. */
  readonly direction: 'above' | 'below';
  readonly labs: string;
  readonly classification: PrecisionClassification;
}

/**
 * Cochran's C and Grubbs' single and double tests of one level with the critical values used
 * (ISO 5725-2 §7.3.3, §7.3.4), and Mandel's indicator values.
 */
@Component({
  selector: 'app-precision-tests-table',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [ClassBadge],
  templateUrl: './tests-table.html',
  styleUrl: './precision.scss',
})
export class TestsTable {
  readonly level = input.required<PrecisionLevelResult>();
  protected readonly fix = fix;
  protected readonly rows = computed<TestRow[]>(() => {
    const l = this.level();
    const out: TestRow[] = [];
    if (l.cochran) {
      out.push({
        name: `Cochran (p = ${l.cochran.p}, n = ${l.cochran.n})`,
        statistic: 'C',
        value: l.cochran.C,
        critical5: l.cochran.critical5,
        critical1: l.cochran.critical1,
        direction: 'above',
        labs: l.cochran.participantCode,
        classification: l.cochran.classification,
      });
    }
    const grubbs = (name: string, g: PrecisionGrubbs | null, direction: 'above' | 'below') => {
      if (g)
        out.push({
          name,
          statistic: 'G',
          value: g.G,
          critical5: g.critical5,
          critical1: g.critical1,
          direction,
          labs: g.participantCodes.join(', '),
          classification: g.classification,
        });
    };
    grubbs('Grubbs single, highest mean', l.grubbs.singleHigh, 'above');
    grubbs('Grubbs single, lowest mean', l.grubbs.singleLow, 'above');
    grubbs('Grubbs double, two highest', l.grubbs.doubleHigh, 'below');
    grubbs('Grubbs double, two lowest', l.grubbs.doubleLow, 'below');
    return out;
  });
}
