import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import { DownloadButton } from './download-button';

/** One report file of a round: its name under the round's reports, and its button (label, test id). */
interface ReportFile {
  file: string;
  label: string;
  testId: string;
}

const ROUND_FILES: readonly ReportFile[] = [
  { file: 'round.pdf', label: 'Round report (PDF)', testId: 'download-round-pdf' },
  { file: 'round.xlsx', label: 'Round workbook (Excel)', testId: 'download-round-xlsx' },
];
const LAB_FILES: readonly ReportFile[] = [
  { file: 'participant.pdf', label: 'Individual report (PDF)', testId: 'download-participant-pdf' },
  { file: 'certificate.pdf', label: 'Certificate (PDF)', testId: 'download-certificate-pdf' },
];
const PRECISION_FILES: readonly ReportFile[] = [
  { file: 'precision.pdf', label: 'Precision report (PDF)', testId: 'download-precision-pdf' },
  {
    file: 'precision.xlsx',
    label: 'Precision workbook (Excel)',
    testId: 'download-precision-xlsx',
  },
];

/**
 * The report downloads of one round, for any page to embed: the round report and workbook
 * (coordinators, labs of a published round, granted assessors) and, with `own` or a `labId`,
 * the lab's individual report and certificate; for a precision study (`precision`), its report
 * and workbook.
 */
@Component({
  selector: 'app-report-downloads',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [DownloadButton],
  template: `
    <div class="downloads" role="group" [attr.aria-label]="groupLabel()">
      @for (f of files(); track f.testId) {
        <app-download-button [path]="f.path" [label]="f.label" [testId]="f.testId" />
      }
    </div>
  `,
  styles: `
    .downloads {
      display: flex;
      flex-wrap: wrap;
      align-items: flex-start;
    }
  `,
})
export class ReportDownloads {
  readonly roundId = input.required<string>();
  /** A lab the caller may read (own lab, or an assessor's granting lab). */
  readonly labId = input<string | null>(null);
  /** Show the caller's own lab files. */
  readonly own = input(false);
  /** The round is a precision study (ISO 5725-2): its own report and workbook. */
  readonly precision = input(false);
  protected readonly files = computed(() => {
    const base = `/rounds/${this.roundId()}/reports/`;
    const at = (files: readonly ReportFile[], query = '') =>
      files.map((f) => ({ ...f, path: base + f.file + query }));
    if (this.precision()) return at(PRECISION_FILES);
    const labId = this.labId();
    if (!this.own() && !labId) return at(ROUND_FILES);
    return [...at(ROUND_FILES), ...at(LAB_FILES, labId ? `?labId=${labId}` : '')];
  });
  protected readonly groupLabel = computed(() =>
    this.precision() ? 'Precision report downloads' : 'Report downloads',
  );
}
