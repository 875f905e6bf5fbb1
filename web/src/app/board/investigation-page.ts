import {
  ChangeDetectionStrategy,
  Component,
  type OnInit,
  inject,
  input,
  signal,
} from '@angular/core';
import { formatDate } from '../core/format';
import { FormControl, FormGroup, ReactiveFormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';
import { RouterLink } from '@angular/router';
import {
  CAUSE_CATEGORIES,
  CAUSE_CATEGORY_LABELS,
  INVESTIGATION_STATE_LABELS,
  InvestigationUpdate,
  type CauseCategory,
  type InvestigationDto,
} from '@ringlet/shared/contracts/evaluation';
import { problemMessage } from '../core/problem';
import { SignalBadge } from '../core/signal-badge';
import { PageLoad } from '../shared/page-load';
import { BoardService } from './board-service';

/** One investigation: the lab records its findings; the manager closes it; others read. */
@Component({
  selector: 'app-investigation-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [
    ReactiveFormsModule,
    MatButtonModule,
    MatFormFieldModule,
    MatInputModule,
    MatSelectModule,
    RouterLink,
    SignalBadge,
  ],
  styleUrl: './board.scss',
  template: `
    <section class="page">
      <h1 data-testid="page-heading">Investigation</h1>
      @if (error()) {
        <p class="form-error" role="alert">{{ error() }}</p>
      }
      @if (inv(); as i) {
        <p>
          Round {{ i.roundCode }} · {{ i.labName }} ({{ i.participantCode }}) · item
          {{ i.itemCode }} · {{ i.measurandName }}: <app-signal-badge [signal]="i.signal" /> ({{
            i.scoreKind === 'z' ? 'z' : 'z′'
          }}
          = {{ i.score.toFixed(2) }}) · {{ stateLabels[i.state] }}
          @if (i.closedAt) {
            — closed by {{ i.closedByName }} on {{ date(i.closedAt) }}
          }
        </p>
        <form class="form-stack" [formGroup]="form" (ngSubmit)="save()">
          <mat-form-field appearance="outline">
            <mat-label>Cause category</mat-label>
            <mat-select formControlName="causeCategory" data-testid="cause">
              @for (c of causeKeys; track c) {
                <mat-option [value]="c">{{ causes[c] }}</mat-option>
              }
            </mat-select>
          </mat-form-field>
          <mat-form-field appearance="outline"
            ><mat-label>Root cause</mat-label
            ><textarea matInput rows="3" formControlName="rootCause"></textarea>
          </mat-form-field>
          <mat-form-field appearance="outline"
            ><mat-label>Corrective action</mat-label
            ><textarea matInput rows="3" formControlName="correctiveAction"></textarea>
          </mat-form-field>
          <mat-form-field appearance="outline"
            ><mat-label>Effectiveness check</mat-label
            ><textarea matInput rows="3" formControlName="effectivenessCheck"></textarea>
          </mat-form-field>
          @if (i.canEdit) {
            <div class="page-actions">
              <button mat-flat-button type="submit">Save</button>
              @if (i.canClose) {
                <button mat-stroked-button type="button" (click)="close()">
                  Close investigation
                </button>
              }
            </div>
          }
        </form>
        @if (message()) {
          <p role="status">{{ message() }}</p>
        }
        <p><a routerLink="/board/investigations">All investigations</a></p>
      }
    </section>
  `,
})
export class InvestigationPage implements OnInit {
  protected readonly stateLabels = INVESTIGATION_STATE_LABELS;
  readonly id = input.required<string>();
  private readonly service = inject(BoardService);
  private readonly page = new PageLoad(() => this.service.investigation(this.id()));
  protected readonly inv = this.page.value;
  protected readonly error = this.page.error;
  protected readonly message = signal<string | null>(null);
  protected readonly causes = CAUSE_CATEGORY_LABELS;
  protected readonly causeKeys = CAUSE_CATEGORIES;
  protected readonly form = new FormGroup({
    causeCategory: new FormControl<CauseCategory | null>(null),
    rootCause: new FormControl('', { nonNullable: true }),
    correctiveAction: new FormControl('', { nonNullable: true }),
    effectivenessCheck: new FormControl('', { nonNullable: true }),
  });

  ngOnInit(): void {
    this.page.load((i) => this.show(i));
  }

  private show(i: InvestigationDto): void {
    this.inv.set(i);
    this.form.setValue({
      causeCategory: i.causeCategory,
      rootCause: i.rootCause,
      correctiveAction: i.correctiveAction,
      effectivenessCheck: i.effectivenessCheck,
    });
    if (i.canEdit) this.form.enable();
    else this.form.disable();
  }

  protected save(): void {
    const parsed = InvestigationUpdate.safeParse(this.form.getRawValue());
    if (!parsed.success) {
      this.error.set(parsed.error.issues[0]?.message ?? 'Check the form.');
      return;
    }
    this.service.updateInvestigation(this.id(), parsed.data).subscribe({
      next: (i) => {
        this.show(i);
        this.error.set(null);
        this.message.set('Saved.');
      },
      error: (e: unknown) => this.error.set(problemMessage(e)),
    });
  }

  protected close(): void {
    this.service
      .updateInvestigation(this.id(), InvestigationUpdate.parse(this.form.getRawValue()))
      .subscribe({
        next: () =>
          this.service.closeInvestigation(this.id()).subscribe({
            next: (i) => {
              this.show(i);
              this.error.set(null);
              this.message.set('Closed.');
            },
            error: (e: unknown) => this.error.set(problemMessage(e)),
          }),
        error: (e: unknown) => this.error.set(problemMessage(e)),
      });
  }

  protected date(iso: string): string {
    return formatDate(iso);
  }
}
