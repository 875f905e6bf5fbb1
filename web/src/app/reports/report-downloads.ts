import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import { DownloadButton } from './download-button';

/**
 * The report downloads of one round, for any page to embed: the round report and workbook
 * (coordinators, labs of a published round, granted assessors) and, with `own` or a `labId`,
 * the lab's individual report and certificate.
 */
@Component({
  selector: 'app-report-downloads',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [DownloadButton],
  template: `
    <div class="downloads" role="group" aria-label="Report downloads">
      <app-download-button
        [path]="base() + 'round.pdf'"
        label="Round report (PDF)"
        testId="download-round-pdf"
      />
      <app-download-button
        [path]="base() + 'round.xlsx'"
        label="Round workbook (Excel)"
        testId="download-round-xlsx"
      />
      @if (own() || labId()) {
        <app-download-button
          [path]="base() + 'participant.pdf' + lab()"
          label="Individual report (PDF)"
          testId="download-participant-pdf"
        />
        <app-download-button
          [path]="base() + 'certificate.pdf' + lab()"
          label="Certificate (PDF)"
          testId="download-certificate-pdf"
        />
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
  protected readonly base = computed(() => `/rounds/${this.roundId()}/reports/`);
  protected readonly lab = computed(() => (this.labId() ? `?labId=${this.labId()}` : ''));
}
