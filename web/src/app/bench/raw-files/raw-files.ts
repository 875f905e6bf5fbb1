import { DecimalPipe } from '@angular/common';
import {
  ChangeDetectionStrategy,
  Component,
  computed,
  inject,
  input,
  linkedSignal,
  output,
  signal,
} from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { FormControl, ReactiveFormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';
import {
  type AttachmentDto,
  type MyRoundDetail,
  REANALYSIS_DEFAULTS,
} from '@ringlet/shared/contracts/bench';
import type { SubmissionData } from '@ringlet/shared/contracts/submission';
import { FileDrop } from '../../core/file-drop';
import { problemMessage, problemOf } from '../../core/problem';
import { BenchService } from '../bench-service';
import { fileRefusal, parametersText } from './reanalysis-text';

const ATTACHMENT_KIND_LABELS: Record<AttachmentDto['kind'], string> = {
  'correlation-csv': 'Correlation function (CSV)',
  text: 'Text',
  pdf: 'PDF',
  xlsx: 'Workbook (XLSX)',
};

/** Raw data files with their cumulants re-analysis, and the results workbook for bulk entry. */
@Component({
  selector: 'app-raw-files',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [
    DecimalPipe,
    ReactiveFormsModule,
    MatButtonModule,
    MatFormFieldModule,
    MatInputModule,
    MatSelectModule,
    FileDrop,
  ],
  templateUrl: './raw-files.html',
  styleUrl: '../bench-round/bench-round.scss',
})
export class RawFiles {
  readonly round = input.required<MyRoundDetail>();
  /** The results as typed (their measurement conditions fill the optics placeholders). */
  readonly data = input<SubmissionData | null>(null);
  /** A workbook was read into the draft. */
  readonly workbookRead = output<void>();
  private readonly bench = inject(BenchService);
  protected readonly kindLabels = ATTACHMENT_KIND_LABELS;
  protected readonly defaults = REANALYSIS_DEFAULTS;
  protected readonly parametersText = parametersText;
  /** The files already stored with the submission (the round page loads them with the round). */
  readonly stored = input<AttachmentDto[]>([]);
  protected readonly attachments = linkedSignal(() => this.stored());
  protected readonly fileMessage = signal<string | null>(null);
  protected readonly fileItem = new FormControl<string | null>(null);
  protected readonly fileWavelength = new FormControl<number | null>(null);
  protected readonly fileAngle = new FormControl<number | null>(null);
  protected readonly uploadProgress = signal<number | null>(null);
  protected readonly workbookMessage = signal<string[]>([]);
  private readonly fileItemId = toSignal(this.fileItem.valueChanges, { initialValue: null });
  /** What the re-analysis will use when the file's fields stay empty: the item's conditions, else the defaults. */
  protected readonly opticsPlaceholder = computed(() => {
    const id = this.fileItemId() ?? this.round().items[0]?.id;
    const c = this.data()?.items.find((i) => i.testItemId === id)?.conditions;
    return {
      wavelength: String(c?.laserWavelengthNm ?? REANALYSIS_DEFAULTS.wavelengthNm),
      angle: String(c?.scatteringAngleDeg ?? REANALYSIS_DEFAULTS.angleDeg),
    };
  });
  private readonly roundId = computed(() => this.round().roundId);

  protected filePicked(file: File): void {
    const wavelength = this.fileWavelength.value;
    const angle = this.fileAngle.value;
    const refusal = fileRefusal(file, wavelength, angle);
    if (refusal) return this.fileMessage.set(refusal);
    this.fileMessage.set(`Uploading ${file.name}…`);
    this.uploadProgress.set(0);
    this.bench
      .upload(
        this.roundId(),
        file,
        this.fileItem.value,
        { laserWavelengthNm: wavelength, scatteringAngleDeg: angle },
        (p) => this.uploadProgress.set(p),
      )
      .subscribe({
        next: (a) => {
          this.uploadProgress.set(null);
          this.attachments.update((list) => [...list, a]);
          this.fileMessage.set(`${a.fileName} stored (SHA-256 ${a.sha256.slice(0, 12)}…).`);
        },
        error: (e) => {
          this.uploadProgress.set(null);
          this.fileMessage.set(problemMessage(e));
        },
      });
  }
  protected fileUrl(a: AttachmentDto): string {
    return this.bench.attachmentUrl(this.roundId(), a.id);
  }
  protected templateUrl(): string {
    return this.bench.templateUrl(this.roundId());
  }
  protected itemCode(id: string | null): string {
    return this.round().items.find((i) => i.id === id)?.code ?? '—';
  }
  protected workbookPicked(file: File): void {
    this.bench.uploadWorkbook(this.roundId(), file).subscribe({
      next: (res) => {
        this.workbookMessage.set([
          `Workbook read into the draft (revision ${res.draftRevision}).`,
          ...res.warnings.map((w) => w.message),
        ]);
        this.workbookRead.emit();
      },
      error: (e) => {
        const p = problemOf(e);
        const details = Array.isArray(p?.details)
          ? (p.details as { message?: string }[]).map((d) => d.message ?? '')
          : [];
        this.workbookMessage.set(details.length ? details : [problemMessage(e)]);
      },
    });
  }
}
