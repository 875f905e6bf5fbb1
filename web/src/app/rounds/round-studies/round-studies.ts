import {
  ChangeDetectionStrategy,
  Component,
  effect,
  inject,
  input,
  output,
  signal,
  untracked,
} from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatDialog } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';
import type { ColDef } from 'ag-grid-community';
import {
  type RoundDetail,
  type Study,
  StudyInput,
  STUDY_KIND_LABELS,
} from '@ringlet/shared/contracts/rounds';
import { FileDrop } from '../../core/file-drop';
import { errorMessage } from '../../core/zod-form-errors';
import type { RowAction } from '../../grid/action-cell';
import { actionsColumn } from '../../grid/columns';
import { openDeskDialog } from '../desk-dialog/desk-dialog';
import { FormSubmit } from '../../shared/form-submit';
import { SectionGrid } from '../../shared/section-grid';
import { RoundsService } from '../rounds-service';
import { studyNumbers } from '../study-numbers';
import { STUDY_COLUMNS, studyInput, studyUpload, type StudyFormValue } from './study-input';

/** Homogeneity and stability studies of a round's test items, and decisions on failed ones. */
@Component({
  selector: 'app-round-studies',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [
    SectionGrid,
    ReactiveFormsModule,
    MatButtonModule,
    MatFormFieldModule,
    MatInputModule,
    MatSelectModule,
    FileDrop,
  ],
  templateUrl: './round-studies.html',
  styleUrl: '../desk-sections.scss',
})
export class RoundStudies {
  readonly round = input.required<RoundDetail>();
  /** Emitted after a study or a decision was stored. */
  readonly changed = output<void>();
  private readonly api = inject(RoundsService);
  private readonly dialog = inject(MatDialog);
  protected readonly errorMessage = errorMessage;
  protected readonly studies = signal<Study[]>([]);
  protected readonly form = inject(NonNullableFormBuilder).group({
    kind: ['homogeneity' as StudyFormValue['kind']],
    testItemId: [''],
    measurandId: [''],
    sigmaPt: [null as number | null],
    text: [''],
  });
  protected readonly submission = new FormSubmit(this.form);

  private readonly actions: RowAction<Study>[] = [
    {
      label: 'Decide',
      ariaLabel: (s) =>
        `Record a decision on the ${STUDY_KIND_LABELS[s.kind].toLowerCase()} of ${s.testItemCode}`,
      run: (s) => this.decide(s),
    },
  ];
  protected readonly columns: ColDef<Study>[] = [
    ...STUDY_COLUMNS,
    actionsColumn(this.actions, 110),
  ];

  constructor() {
    effect(() => {
      const r = this.round();
      untracked(() => {
        const c = this.form.controls;
        if (!c.testItemId.value && r.items[0]) c.testItemId.setValue(r.items[0].id);
        if (!c.measurandId.value && r.measurands[0]) c.measurandId.setValue(r.measurands[0].id);
        this.api.studies(r.id).subscribe((s) => this.studies.set(s));
      });
    });
  }

  private decide(s: Study): void {
    if (s.passes) return;
    openDeskDialog(
      this.dialog,
      {
        kind: 'decision',
        title: `Decision on the ${STUDY_KIND_LABELS[s.kind].toLowerCase()} of item ${s.testItemCode}`,
        intro: studyNumbers(s),
        send: (v) => this.api.decide(this.round().id, s.id, v),
      },
      () => this.changed.emit(),
    );
  }

  protected recordStudy(): void {
    const body = studyInput(this.form.getRawValue());
    const record = (v: StudyInput) => this.api.recordStudy(this.round().id, v);
    this.submission.submit(StudyInput, body, record, () => this.changed.emit());
  }

  protected upload(file: File): void {
    const upload = this.api.uploadStudy(
      this.round().id,
      studyUpload(this.form.getRawValue(), file),
    );
    this.submission.run(upload, () => this.changed.emit());
  }
}
