import {
  ChangeDetectionStrategy,
  Component,
  type OnInit,
  computed,
  inject,
  input,
  signal,
} from '@angular/core';
import { HttpErrorResponse } from '@angular/common/http';
import { NonNullableFormBuilder, ReactiveFormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { RouterLink } from '@angular/router';
import {
  EVALUATION_STATE_LABELS,
  type EvaluationView,
  type Exclusion,
  type SigmaPtOverride,
} from '@ringlet/shared/contracts/evaluation';
import { ROUND_STATE_LABELS, type RoundState } from '@ringlet/shared/contracts/round-states';
import { problemMessage } from '../../core/problem';
import { PageLoad } from '../../shared/page-load';
import { BoardService } from '../board-service';
import { EvaluationPreview } from '../evaluation-preview/evaluation-preview';
import { ExclusionForm } from '../exclusion-form/exclusion-form';
import { RoundComments } from '../round-comments/round-comments';
import { SigmaOverrideForm } from '../sigma-override-form/sigma-override-form';
import {
  canReissue,
  type EvaluationSettings,
  isDirty,
  replicatesOf,
  withOverride,
} from './evaluation-logic';

/**
 * The coordinator's evaluation: change the σ_pt rule or exclude a result (rule + reason) and see
 * the effect at once (the shared engine runs in the browser on the stored replicates), then save
 * the draft, approve it for publication, publish, or reissue with a reason.
 */
@Component({
  selector: 'app-evaluation-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [
    ReactiveFormsModule,
    MatButtonModule,
    MatFormFieldModule,
    MatInputModule,
    RouterLink,
    EvaluationPreview,
    SigmaOverrideForm,
    ExclusionForm,
    RoundComments,
  ],
  styleUrl: '../board.scss',
  templateUrl: './evaluation-page.html',
})
export class EvaluationPage implements OnInit {
  readonly id = input.required<string>();
  private readonly service = inject(BoardService);
  /** No evaluation yet (404) is not an error: the page offers to start one. */
  private readonly page = new PageLoad(
    () => this.service.evaluation(this.id()),
    (e: unknown) => {
      const none = e instanceof HttpErrorResponse && e.status === 404;
      this.missing.set(none);
      return none ? null : problemMessage(e);
    },
  );
  protected readonly view = this.page.value;
  protected readonly missing = signal(false);
  protected readonly error = this.page.error;
  protected readonly message = signal<string | null>(null);
  protected readonly overrides = signal<SigmaPtOverride[]>([]);
  protected readonly exclusions = signal<Exclusion[]>([]);
  protected readonly evaluationStateLabels = EVALUATION_STATE_LABELS;
  protected readonly reissueReason = inject(NonNullableFormBuilder).control('');
  protected readonly canReissue = computed(() => canReissue(this.view()));
  protected readonly settings = computed<EvaluationSettings>(() => ({
    sigmaPtOverrides: this.overrides(),
    exclusions: this.exclusions(),
  }));
  protected readonly dirty = computed(() => {
    const v = this.view();
    return !!v && isDirty(v, this.settings());
  });
  /** Participant codes with a result in this round (an exclusion must name one). */
  protected readonly codes = computed(() => {
    const v = this.view();
    return new Set(v ? replicatesOf(v).map((r) => r.code) : []);
  });

  ngOnInit(): void {
    this.page.load((v) => this.show(v));
  }

  private show(v: EvaluationView): void {
    this.view.set(v);
    this.missing.set(false);
    this.overrides.set(v.settings.sigmaPtOverrides);
    this.exclusions.set(v.settings.exclusions);
  }

  protected stateLabel(s: string): string {
    return ROUND_STATE_LABELS[s as RoundState] ?? s;
  }

  protected addOverride(o: SigmaPtOverride): void {
    this.overrides.update((l) => withOverride(l, o));
  }
  protected removeOverride(i: number): void {
    this.overrides.update((l) => l.filter((_, j) => j !== i));
  }
  protected addExclusion(x: Exclusion): void {
    this.exclusions.update((l) => [...l, x]);
  }
  protected removeExclusion(i: number): void {
    this.exclusions.update((l) => l.filter((_, j) => j !== i));
  }

  protected done(text: string): void {
    this.error.set(null);
    this.message.set(text);
  }
  private stored(text: string) {
    return {
      next: (v: EvaluationView) => {
        this.show(v);
        this.done(text);
      },
      error: (e: unknown) => this.error.set(problemMessage(e)),
    };
  }
  protected save(): void {
    this.service.evaluate(this.id(), this.settings()).subscribe(this.stored('Draft saved.'));
  }
  protected commit(): void {
    this.service
      .commit(this.id())
      .subscribe(this.stored('Evaluation approved for publication: the round is evaluated.'));
  }
  protected publish(): void {
    this.service.publish(this.id()).subscribe({
      next: (r) => {
        this.message.set(
          `Published version ${r.version}: ${r.labsNotified} labs e-mailed, ${r.investigationsOpened} investigations opened.`,
        );
        this.service.evaluation(this.id()).subscribe((v) => this.show(v));
      },
      error: (e: unknown) => this.error.set(problemMessage(e)),
    });
  }
  protected reissue(): void {
    this.service
      .reissue(this.id(), this.reissueReason.value, this.settings())
      .subscribe(this.stored('Reissued as a new version; publish it to inform the labs.'));
  }
}
