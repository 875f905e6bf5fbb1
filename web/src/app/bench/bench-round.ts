import { DatePipe, DecimalPipe } from '@angular/common';
import {
  ChangeDetectionStrategy,
  Component,
  DestroyRef,
  OnInit,
  computed,
  inject,
  input,
  signal,
} from '@angular/core';
import { takeUntilDestroyed } from '@angular/core/rxjs-interop';
import { FormArray, FormControl, FormGroup, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatCheckboxModule } from '@angular/material/checkbox';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';
import { RouterLink } from '@angular/router';
import {
  checkResults,
  instrumentCheckNotice,
  type CheckOutcome,
} from '@ringlet/shared/bench/submission-checks';
import { DEFAULT_CHECK, judgeInstrumentCheck } from '@ringlet/shared/bench/instrument-check';
import {
  type AttachmentDto,
  DAMAGED_CONDITIONS,
  type InstrumentCheck,
  InstrumentCheckInput,
  type MyRoundDetail,
  REANALYSIS_DEFAULTS,
  type Reanalysis,
  ReceiptInput,
  SHIPMENT_CONDITION_LABELS,
  type ShipmentCondition,
  type SubmissionVersionDto,
} from '@ringlet/shared/contracts/bench';
import type { SubmissionData } from '@ringlet/shared/contracts/submission';
import {
  DAMAGED_PARCEL_CAUTIONS,
  mentionsSharps,
  SHARPS_CAUTIONS,
} from '@ringlet/shared/contracts/safety';
import { FileDrop } from '../core/file-drop';
import { fieldLabel, problemMessage, problemOf } from '../core/problem';
import { DraftAutosave, SAVE_STATE_LABELS } from './autosave';
import { BenchService } from './bench.service';
import {
  CONDITION_FIELDS,
  buildResultsForm,
  resultsFromForm,
  type ResultsForm,
} from './results-form';
import { STATUS_LABELS } from './lab-bench';

const CONDITIONS = (Object.entries(SHIPMENT_CONDITION_LABELS) as [ShipmentCondition, string][]).map(
  ([value, label]) => ({ value, label }),
);

const UNCERTAINTY_KINDS = [
  { value: 'none', label: 'None given' },
  { value: 'standard', label: 'Standard u' },
  { value: 'expanded', label: 'Expanded U' },
] as const;

const ATTACHMENT_KIND_LABELS: Record<AttachmentDto['kind'], string> = {
  'correlation-csv': 'Correlation function (CSV)',
  text: 'Text',
  pdf: 'PDF',
  xlsx: 'Workbook (XLSX)',
};

const PARAMETER_LABELS: Record<Reanalysis['assumed'][number], string> = {
  temperatureC: 'temperature',
  viscosityMPas: 'viscosity',
  refractiveIndex: 'refractive index',
  wavelengthNm: 'wavelength',
  angleDeg: 'angle',
};

const run = () =>
  new FormGroup({
    zAverageNm: new FormControl<number | null>(null, Validators.required),
    pdi: new FormControl<number | null>(null, Validators.required),
    temperatureC: new FormControl<number | null>(DEFAULT_CHECK.setPointC, Validators.required),
    equilibrationMin: new FormControl<number | null>(
      DEFAULT_CHECK.minEquilibrationMin,
      Validators.required,
    ),
  });

/** One round on the Lab bench: receipt, instrument check, results entry, files, submit and amend. */
@Component({
  selector: 'app-bench-round',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [
    DatePipe,
    DecimalPipe,
    RouterLink,
    ReactiveFormsModule,
    MatButtonModule,
    MatCheckboxModule,
    MatFormFieldModule,
    MatInputModule,
    MatSelectModule,
    FileDrop,
  ],
  templateUrl: './bench-round.html',
  styleUrl: './bench-round.scss',
})
export class BenchRound implements OnInit {
  readonly id = input.required<string>();
  private readonly bench = inject(BenchService);
  private readonly destroyRef = inject(DestroyRef);

  protected readonly round = signal<MyRoundDetail | null>(null);
  protected readonly loadError = signal<string | null>(null);
  protected readonly statusLabels = STATUS_LABELS;
  protected readonly conditions = CONDITIONS;
  protected readonly uncertaintyKinds = UNCERTAINTY_KINDS;
  protected readonly kindLabels = ATTACHMENT_KIND_LABELS;
  protected readonly defaults = REANALYSIS_DEFAULTS;
  protected readonly sharpsCautions = SHARPS_CAUTIONS;
  protected readonly damagedCautions = DAMAGED_PARCEL_CAUTIONS;
  protected readonly conditionLabel = (c: ShipmentCondition | null | undefined) =>
    c ? SHIPMENT_CONDITION_LABELS[c] : '';
  /**
   * The sharps cautions join the list when the instructions or an item's notes mention syringes,
   * needles or filters, or when the lab states a filter pore size (filtering means a syringe filter).
   */
  protected readonly usesSharps = computed(() => {
    const r = this.round();
    if (!r) return false;
    const filtered = (this.data()?.items ?? []).some(
      (i) => i.conditions.filterPoreUm !== null && i.conditions.filterPoreUm !== undefined,
    );
    return (
      filtered ||
      mentionsSharps(
        [
          r.instructions,
          ...r.items.map((i) => `${i.handlingNotes ?? ''} ${i.storageNotes ?? ''}`),
        ].join(' '),
      )
    );
  });
  protected readonly conditionFields = CONDITION_FIELDS;
  protected readonly saveLabels = SAVE_STATE_LABELS;

  // Receipt
  protected readonly receiptForm = new FormGroup({
    receivedOn: new FormControl(new Date().toISOString().slice(0, 10), { nonNullable: true }),
    condition: new FormControl<ShipmentCondition>('intact', { nonNullable: true }),
    notes: new FormControl('', { nonNullable: true }),
  });
  private receiptPhoto: File | null = null;
  protected readonly receiptMessage = signal<string | null>(null);
  private readonly chosenCondition = signal<ShipmentCondition>('intact');
  /** The damaged-parcel cautions show while the form or the record says damaged or leaked. */
  protected readonly parcelDamaged = computed(() => {
    const stored = this.round()?.receipt?.condition ?? null;
    return (
      DAMAGED_CONDITIONS.includes(this.chosenCondition()) ||
      (!!stored && DAMAGED_CONDITIONS.includes(stored))
    );
  });

  // Instrument check
  protected readonly checkForm = new FormGroup({
    instrument: new FormControl('', { nonNullable: true }),
    material: new FormControl<string>(DEFAULT_CHECK.material, { nonNullable: true }),
    referenceValueNm: new FormControl<number>(DEFAULT_CHECK.referenceValueNm, {
      nonNullable: true,
    }),
    toleranceNm: new FormControl<number>(DEFAULT_CHECK.toleranceNm, { nonNullable: true }),
    pdiLimit: new FormControl<number>(DEFAULT_CHECK.pdiLimit, { nonNullable: true }),
    setPointC: new FormControl<number>(DEFAULT_CHECK.setPointC, { nonNullable: true }),
    temperatureToleranceC: new FormControl<number>(DEFAULT_CHECK.temperatureToleranceC, {
      nonNullable: true,
    }),
    minEquilibrationMin: new FormControl<number>(DEFAULT_CHECK.minEquilibrationMin, {
      nonNullable: true,
    }),
    runs: new FormArray([run(), run(), run()]),
    notes: new FormControl('', { nonNullable: true }),
  });
  protected readonly checks = signal<InstrumentCheck[]>([]);
  protected readonly checkMessage = signal<string | null>(null);
  private readonly checkValue = signal(this.checkForm.getRawValue());
  protected readonly checkPreview = computed(() => {
    const v = this.checkValue();
    const runs = v.runs.filter((r) => r.zAverageNm !== null && r.pdi !== null);
    if (runs.length === 0) return null;
    return judgeInstrumentCheck({
      ...v,
      runs: runs.map((r) => ({
        zAverageNm: r.zAverageNm!,
        pdi: r.pdi!,
        temperatureC: r.temperatureC ?? NaN,
        equilibrationMin: r.equilibrationMin ?? NaN,
      })),
    });
  });

  // Results
  protected form: ResultsForm | null = null;
  protected readonly data = signal<SubmissionData | null>(null);
  protected readonly acknowledged = signal<string[]>([]);
  protected readonly explanation = new FormControl('', { nonNullable: true });
  protected readonly amendNote = new FormControl('', { nonNullable: true });
  protected autosave: DraftAutosave<SubmissionData> | null = null;
  protected readonly outcome = computed<CheckOutcome | null>(() => {
    const r = this.round();
    const d = this.data();
    if (!r || !d) return null;
    return checkResults(
      d,
      { protocolTemperatureC: r.protocolTemperatureC, items: r.items, measurands: r.measurands },
      false,
    );
  });
  protected readonly errorsByPath = computed(
    () => new Map((this.outcome()?.errors ?? []).map((e) => [e.path, e.message])),
  );
  protected readonly checkNotice = computed(() => {
    const d = this.data();
    const names = new Set(
      (d?.items ?? []).map((i) => i.conditions.instrument.trim().toLowerCase()).filter(Boolean),
    );
    const list = this.checks();
    const latest = names.size
      ? (list.find((c) => names.has(c.instrument.trim().toLowerCase())) ?? null)
      : (list[0] ?? null);
    return instrumentCheckNotice(
      latest
        ? {
            passed: latest.verdict.passed,
            instrument: latest.instrument,
            checkedAt: latest.checkedAt,
          }
        : null,
    );
  });
  protected readonly versions = signal<SubmissionVersionDto[]>([]);
  protected readonly submitting = signal(false);
  protected readonly submitMessage = signal<{ kind: 'ok' | 'error'; text: string } | null>(null);
  private submitKey: string | null = null;

  // Files
  protected readonly attachments = signal<AttachmentDto[]>([]);
  protected readonly fileMessage = signal<string | null>(null);
  protected readonly fileItem = new FormControl<string | null>(null);
  protected readonly fileWavelength = new FormControl<number | null>(null);
  protected readonly fileAngle = new FormControl<number | null>(null);
  protected readonly uploadProgress = signal<number | null>(null);
  private readonly fileItemId = signal<string | null>(null);
  /** What the re-analysis will use when the file's fields stay empty: the item's conditions, else the defaults. */
  protected readonly opticsPlaceholder = computed(() => {
    const d = this.data();
    const id = this.fileItemId() ?? this.round()?.items[0]?.id;
    const c = d?.items.find((i) => i.testItemId === id)?.conditions;
    return {
      wavelength: String(c?.laserWavelengthNm ?? REANALYSIS_DEFAULTS.wavelengthNm),
      angle: String(c?.scatteringAngleDeg ?? REANALYSIS_DEFAULTS.angleDeg),
    };
  });
  protected readonly workbookMessage = signal<string[]>([]);

  ngOnInit(): void {
    this.checkForm.valueChanges
      .pipe(takeUntilDestroyed(this.destroyRef))
      .subscribe(() => this.checkValue.set(this.checkForm.getRawValue()));
    this.receiptForm.controls.condition.valueChanges
      .pipe(takeUntilDestroyed(this.destroyRef))
      .subscribe((c) => this.chosenCondition.set(c));
    this.fileItem.valueChanges
      .pipe(takeUntilDestroyed(this.destroyRef))
      .subscribe((id) => this.fileItemId.set(id));
    const online = () => this.autosave?.retry();
    window.addEventListener('online', online);
    this.destroyRef.onDestroy(() => {
      window.removeEventListener('online', online);
      this.autosave?.stop();
    });
    this.load();
  }

  private load(): void {
    this.bench.round(this.id()).subscribe({
      next: (r) => {
        this.round.set(r);
        if (r.receipt?.receivedOn) {
          this.receiptForm.setValue({
            receivedOn: r.receipt.receivedOn,
            condition: r.receipt.condition ?? 'intact',
            notes: r.receipt.notes ?? '',
          });
        }
        this.loadSubmission(r);
      },
      error: (e) => this.loadError.set(problemMessage(e)),
    });
    this.bench.instrumentChecks().subscribe((c) => this.checks.set(c));
    this.bench.attachments(this.id()).subscribe((a) => this.attachments.set(a));
  }

  private loadSubmission(r: MyRoundDetail): void {
    this.bench.submission(this.id()).subscribe((view) => {
      this.autosave?.stop();
      this.autosave = new DraftAutosave<SubmissionData>(
        (data, base) => this.bench.saveDraft(this.id(), data, base),
        `ringlet.draft.${this.bench.labId()}.${this.id()}`,
      );
      const local = this.autosave.start(view.draftRevision);
      const draft = local ?? view.draft;
      if (view.savedAt) this.autosave.savedAt.set(view.savedAt);
      if (view.isLocked) this.autosave.state.set('locked');
      else if (view.savedAt) this.autosave.state.set('saved');
      this.versions.set(view.versions);
      this.acknowledged.set(draft.acknowledgedWarnings);
      this.explanation.setValue(draft.explanation, { emitEvent: false });
      this.form = buildResultsForm(r.items, r.measurands, draft, r.protocolTemperatureC);
      if (view.isLocked) this.form.disable({ emitEvent: false });
      this.refreshData(false);
      if (local) this.autosave.changed(this.data()!); // an unsaved copy from before a reload
      this.form.valueChanges
        .pipe(takeUntilDestroyed(this.destroyRef))
        .subscribe(() => this.refreshData(true));
      this.explanation.valueChanges
        .pipe(takeUntilDestroyed(this.destroyRef))
        .subscribe(() => this.refreshData(true));
    });
  }

  private refreshData(save: boolean): void {
    const r = this.round();
    if (!r || !this.form) return;
    const data = resultsFromForm(
      this.form,
      r.items,
      r.measurands,
      this.acknowledged(),
      this.explanation.value,
    );
    this.data.set(data);
    if (save) this.autosave?.changed(data);
  }

  protected rep(ii: number, mi: number, k: number): FormControl<number | null> {
    return this.form!.at(ii).controls.results.at(mi).controls.replicates.at(k);
  }
  protected row(ii: number, mi: number) {
    return this.form!.at(ii).controls.results.at(mi).controls;
  }
  protected cond(ii: number, key: string): FormControl {
    return this.form!.at(ii).controls.conditions.get(key) as FormControl;
  }
  protected notes(ii: number): FormControl<string> {
    return this.form!.at(ii).controls.methodNotes;
  }
  protected runIndexes(n: number): number[] {
    return Array.from({ length: n }, (_, i) => i);
  }
  protected errorAt(path: string): string | undefined {
    return this.errorsByPath().get(path);
  }
  protected isAcknowledged(code: string): boolean {
    return this.acknowledged().includes(code);
  }
  protected acknowledge(code: string, on: boolean): void {
    this.acknowledged.update((list) =>
      on ? [...new Set([...list, code])] : list.filter((c) => c !== code),
    );
    this.refreshData(true);
  }
  protected retrySave(): void {
    this.autosave?.retry();
  }
  protected reloadDraft(): void {
    const r = this.round();
    if (r) this.loadSubmission(r);
  }

  // ---------------------------------------------------------------- receipt
  protected photoPicked(file: File): void {
    this.receiptPhoto = file;
  }
  protected saveReceipt(): void {
    const parsed = ReceiptInput.safeParse(this.receiptForm.getRawValue());
    if (!parsed.success) return this.receiptMessage.set(parsed.error.issues[0]!.message);
    this.bench.saveReceipt(this.id(), parsed.data, this.receiptPhoto).subscribe({
      next: (r) => {
        this.round.set(r);
        this.receiptMessage.set('Receipt recorded.');
      },
      error: (e) => this.receiptMessage.set(problemMessage(e)),
    });
  }

  // ---------------------------------------------------------------- instrument check
  protected get checkRuns() {
    return this.checkForm.controls.runs;
  }
  protected addRun(): void {
    this.checkRuns.push(run());
  }
  protected recordCheck(): void {
    const parsed = InstrumentCheckInput.safeParse(this.checkForm.getRawValue());
    if (!parsed.success) {
      const i = parsed.error.issues[0]!;
      return this.checkMessage.set(`${fieldLabel(i.path.map(String).join('.'))}: ${i.message}`);
    }
    this.bench.recordCheck(parsed.data).subscribe({
      next: (c) => {
        this.checks.update((list) => [c, ...list]);
        this.checkMessage.set(
          c.verdict.passed ? 'Check recorded: passed.' : 'Check recorded: failed.',
        );
      },
      error: (e) => this.checkMessage.set(problemMessage(e)),
    });
  }

  // ---------------------------------------------------------------- submit
  protected submit(): void {
    const data = this.data();
    const outcome = this.outcome();
    if (!data || !outcome) return;
    const r = this.round()!;
    const full = checkResults(
      data,
      { protocolTemperatureC: r.protocolTemperatureC, items: r.items, measurands: r.measurands },
      true,
    );
    if (full.errors.length)
      return this.submitMessage.set({ kind: 'error', text: full.errors[0]!.message });
    if (full.unacknowledged.length)
      return this.submitMessage.set({
        kind: 'error',
        text: `Acknowledge ${full.unacknowledged.length} warning(s) first.`,
      });
    if (this.checkNotice() && !data.explanation.trim())
      return this.submitMessage.set({ kind: 'error', text: this.checkNotice()! });
    this.submitKey ??= crypto.randomUUID();
    this.submitting.set(true);
    const note = this.versions().length ? this.amendNote.value.trim() || undefined : undefined;
    this.bench.submit(this.id(), this.submitKey, data, note).subscribe({
      next: (res) => {
        this.submitKey = null;
        this.submitting.set(false);
        this.amendNote.setValue('');
        this.submitMessage.set({ kind: 'ok', text: `Version ${res.version.version} submitted.` });
        this.versions.update((v) =>
          v.some((x) => x.version === res.version.version) ? v : [res.version, ...v],
        );
        this.reloadDraft();
        this.bench.round(this.id()).subscribe((rr) => this.round.set(rr));
      },
      error: (e) => {
        this.submitting.set(false);
        if (problemOf(e)) this.submitKey = null; // the server answered: a new attempt is a new intent
        this.submitMessage.set({ kind: 'error', text: problemMessage(e) });
      },
    });
  }

  // ---------------------------------------------------------------- files
  protected filePicked(file: File): void {
    if (file.size > 20 * 1024 * 1024) {
      this.fileMessage.set(`${file.name} is larger than 20 MB.`);
      return;
    }
    const wavelength = this.fileWavelength.value;
    const angle = this.fileAngle.value;
    if (wavelength !== null && !(wavelength >= 200 && wavelength <= 2000)) {
      this.fileMessage.set(
        'Laser wavelength: give a value from 200 to 2000 nm, or leave it empty.',
      );
      return;
    }
    if (angle !== null && !(angle > 0 && angle < 180)) {
      this.fileMessage.set(
        'Scattering angle: give a value above 0° and below 180°, or leave it empty.',
      );
      return;
    }
    this.fileMessage.set(`Uploading ${file.name}…`);
    this.uploadProgress.set(0);
    this.bench
      .upload(
        this.id(),
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
  /** The physics a re-analysis used, naming the values Ringlet assumed. */
  protected parametersText(ra: Reanalysis): string {
    const p = ra.parameters;
    const mark = (k: Reanalysis['assumed'][number]) => (ra.assumed.includes(k) ? ' (assumed)' : '');
    const parts = [
      `${p.wavelengthNm} nm${mark('wavelengthNm')}`,
      `${p.angleDeg}°${mark('angleDeg')}`,
      `${p.temperatureC} °C${mark('temperatureC')}`,
      `viscosity ${p.viscosityMPas.toFixed(4)} mPa·s${mark('viscosityMPas')}`,
      `refractive index ${p.refractiveIndex.toFixed(4)}${mark('refractiveIndex')}`,
    ];
    const assumed = ra.assumed.map((k) => PARAMETER_LABELS[k]);
    return (
      `Used: ${parts.join(', ')}.` +
      (assumed.length ? ` Assumed because not given: ${assumed.join(', ')}.` : '')
    );
  }
  protected fileUrl(a: AttachmentDto): string {
    return this.bench.attachmentUrl(this.id(), a.id);
  }
  protected templateUrl(): string {
    return this.bench.templateUrl(this.id());
  }
  protected itemCode(id: string | null): string {
    return this.round()?.items.find((i) => i.id === id)?.code ?? '—';
  }
  protected workbookPicked(file: File): void {
    this.bench.uploadWorkbook(this.id(), file).subscribe({
      next: (res) => {
        this.workbookMessage.set([
          `Workbook read into the draft (revision ${res.draftRevision}).`,
          ...res.warnings.map((w) => w.message),
        ]);
        this.reloadDraft();
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
