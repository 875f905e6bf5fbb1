import { DatePipe } from '@angular/common';
import {
  ChangeDetectionStrategy,
  Component,
  DestroyRef,
  type OnInit,
  computed,
  inject,
  input,
  signal,
} from '@angular/core';
import { takeUntilDestroyed } from '@angular/core/rxjs-interop';
import { catchError, forkJoin, of } from 'rxjs';
import { FormControl, ReactiveFormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatCheckboxModule } from '@angular/material/checkbox';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { RouterLink } from '@angular/router';
import { checkResults, type CheckOutcome } from '@ringlet/shared/bench/submission-checks';
import {
  type AttachmentDto,
  type InstrumentCheck,
  type MyRoundDetail,
  type SubmissionVersionDto,
  type SubmissionView,
} from '@ringlet/shared/contracts/bench';
import type { SubmissionData } from '@ringlet/shared/contracts/submission';
import { BenchReceipt } from '../bench-receipt/bench-receipt';
import { InstrumentCheckCard } from '../instrument-check/instrument-check';
import { HandlingCard } from '../handling-card/handling-card';
import { RawFiles } from '../raw-files/raw-files';
import { ResultsEntry } from '../results-entry/results-entry';
import { SubmittedVersions } from '../submitted-versions/submitted-versions';
import { problemMessage, problemOf } from '../../core/problem';
import { DraftAutosave, SAVE_STATE_LABELS } from '../autosave';
import { BenchService } from '../bench-service';
import { buildResultsForm, resultsFromForm, type ResultsForm } from '../results-form';
import { STATUS_LABELS } from '../lab-bench';
import { checkNoticeFor, submitBlocker, withVersion } from './submit-rules';

/** One round on the Lab bench: receipt, instrument check, results entry, files, submit and amend. */
@Component({
  selector: 'app-bench-round',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [
    DatePipe,
    RouterLink,
    ReactiveFormsModule,
    MatButtonModule,
    MatCheckboxModule,
    MatFormFieldModule,
    MatInputModule,
    BenchReceipt,
    ResultsEntry,
    InstrumentCheckCard,
    SubmittedVersions,
    RawFiles,
    HandlingCard,
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
  protected readonly saveLabels = SAVE_STATE_LABELS;

  protected readonly checks = signal<InstrumentCheck[]>([]);
  /** The files stored with the submission. */
  protected readonly attachments = signal<AttachmentDto[]>([]);

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
  protected readonly checkNotice = computed(() => checkNoticeFor(this.data(), this.checks()));
  protected readonly versions = signal<SubmissionVersionDto[]>([]);
  protected readonly submitting = signal(false);
  protected readonly submitMessage = signal<{ kind: 'ok' | 'error'; text: string } | null>(null);
  private submitKey: string | null = null;

  ngOnInit(): void {
    const online = () => this.autosave?.retry();
    window.addEventListener('online', online);
    this.destroyRef.onDestroy(() => {
      window.removeEventListener('online', online);
      this.autosave?.stop();
    });
    this.load();
  }

  /** The round, its submission and its files need only the route's id: all asked at once (#17). */
  private load(): void {
    const id = this.id();
    // the page shows nothing of the submission without the round; a refused submission shows none
    const submission = this.bench.submission(id).pipe(catchError(() => of(null)));
    forkJoin([this.bench.round(id), submission]).subscribe({
      next: ([r, view]) => {
        this.round.set(r);
        if (view) this.showSubmission(r, view);
      },
      error: (e) => this.loadError.set(problemMessage(e)),
    });
    this.bench.attachments(id).subscribe((a) => this.attachments.set(a));
    this.bench.instrumentChecks().subscribe((c) => this.checks.set(c));
  }

  private loadSubmission(r: MyRoundDetail): void {
    this.bench.submission(this.id()).subscribe((view) => this.showSubmission(r, view));
  }

  private showSubmission(r: MyRoundDetail, view: SubmissionView): void {
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

  protected checkRecorded(c: InstrumentCheck): void {
    this.checks.update((list) => [c, ...list]);
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
    const blocker = submitBlocker(full, this.checkNotice(), data.explanation);
    if (blocker) return this.submitMessage.set({ kind: 'error', text: blocker });
    this.submitKey ??= crypto.randomUUID();
    this.submitting.set(true);
    const note = this.versions().length ? this.amendNote.value.trim() || undefined : undefined;
    this.bench.submit(this.id(), this.submitKey, data, note).subscribe({
      next: (res) => {
        this.submitKey = null;
        this.submitting.set(false);
        this.amendNote.setValue('');
        this.submitMessage.set({ kind: 'ok', text: `Version ${res.version.version} submitted.` });
        this.versions.update((v) => withVersion(v, res.version));
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
}
