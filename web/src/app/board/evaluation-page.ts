import {
  ChangeDetectionStrategy,
  Component,
  OnInit,
  computed,
  inject,
  input,
  signal,
} from '@angular/core';
import { HttpErrorResponse } from '@angular/common/http';
import { FormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';
import { RouterLink } from '@angular/router';
import {
  EXCLUSION_RULES,
  EXCLUSION_RULE_LABELS,
  EVALUATION_STATE_LABELS,
  Exclusion,
  SigmaPtOverride,
  type EvaluationView,
  type ItemMeasurandEvaluation,
  type SigmaPtRuleInput,
} from '@ringlet/shared/contracts/evaluation';
import { ROUND_STATE_LABELS, type RoundState } from '@ringlet/shared/contracts/round-states';
import { evaluateRecord, type ReplicateInput } from '@ringlet/shared/evaluation/evaluate';
import { fieldLabel, problemMessage } from '../core/problem';
import { BoardService } from './board.service';
import { ProviderService } from '../provider/provider.service';

type Counts = { acceptable: number; warning: number; action: number };
const count = (r: ItemMeasurandEvaluation): Counts => {
  const c = { acceptable: 0, warning: 0, action: 0 };
  for (const p of r.participants) if (p.signal) c[p.signal]++;
  return c;
};
const ruleText = (r: SigmaPtRuleInput): string =>
  r.kind === 'fixed'
    ? `fixed ${r.value}`
    : r.kind === 'percent'
      ? `${r.percent} % of x_pt`
      : r.kind === 'robust-sd'
        ? 'robust SD s*'
        : `precision σ_R ${r.sigmaR}`;

/**
 * The coordinator's evaluation: change the σ_pt rule or exclude a result (rule + reason) and see
 * the effect at once (the shared engine runs in the browser on the stored replicates), then save
 * the draft, approve it for publication, publish, or reissue with a reason.
 */
@Component({
  selector: 'app-evaluation-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [
    FormsModule,
    MatButtonModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatSelectModule,
    RouterLink,
  ],
  styleUrl: './board.scss',
  template: `
    <section class="page">
      <h1 data-testid="page-heading">Evaluation{{ view() ? ': ' + view()!.roundCode : '' }}</h1>
      @if (error()) {
        <p class="form-error" role="alert" data-testid="evaluation-error">{{ error() }}</p>
      }
      @if (message()) {
        <p role="status" data-testid="evaluation-message">{{ message() }}</p>
      }
      @if (missing()) {
        <p>
          This round has no evaluation yet. Evaluating uses every lab's current submitted version.
        </p>
        <button mat-flat-button type="button" (click)="save()" data-testid="evaluate">
          Evaluate
        </button>
      }
      @if (view(); as v) {
        <p class="note" data-testid="evaluation-state">
          Round {{ stateLabel(v.roundState) }} · version {{ v.version }} ·
          {{ evaluationStateLabels[v.state] }} · software {{ v.softwareVersion }}
          @if (v.reissueReason) {
            · correction: {{ v.reissueReason }}
          }
        </p>
        <div class="page-actions">
          <a mat-button [routerLink]="['/board/rounds', v.roundId]">Consensus board</a>
          @if (v.roundState === 'closed') {
            <button mat-stroked-button type="button" (click)="save()" data-testid="save-draft">
              Save draft with these settings
            </button>
            <button
              mat-flat-button
              type="button"
              (click)="commit()"
              [disabled]="v.state !== 'draft' || dirty()"
              data-testid="commit"
            >
              Approve for publication
            </button>
          }
          @if (v.roundState === 'evaluated') {
            <a
              mat-stroked-button
              [routerLink]="['/desk/rounds', v.roundId]"
              data-testid="reopen-evaluation-link"
              >Reopen evaluation (on the Round desk)</a
            >
          }
          @if (
            (v.roundState === 'evaluated' || v.roundState === 'reissued') && v.state === 'committed'
          ) {
            <button mat-flat-button type="button" (click)="publish()" data-testid="publish">
              Publish and e-mail the labs
            </button>
          }
        </div>

        <h2>Preview</h2>
        <p class="note">
          Computed here in your browser with the same engine as the server; nothing is stored until
          you save.
        </p>
        <div class="table-scroll">
          <table class="rl-table" aria-label="Evaluation preview" data-testid="preview">
            <thead>
              <tr>
                <th>Item</th>
                <th>Measurand</th>
                <th class="num">p</th>
                <th class="num">x_pt</th>
                <th class="num">u(x_pt)</th>
                <th>σ_pt rule</th>
                <th class="num">σ_pt</th>
                <th class="num">Acceptable</th>
                <th class="num">Warning</th>
                <th class="num">Action</th>
                <th>Notes</th>
              </tr>
            </thead>
            <tbody>
              @for (r of preview(); track $index) {
                <tr [class.changed]="changedGroup($index)">
                  <td>{{ r.itemCode }}</td>
                  <td>{{ r.measurandName }}{{ r.unit ? ' (' + r.unit + ')' : '' }}</td>
                  <td class="num">{{ r.n }}</td>
                  <td class="num">{{ fix(r.assignedValue, r.decimals + 1) }}</td>
                  <td class="num">{{ fix(r.uAssigned, r.decimals + 2) }}</td>
                  <td>{{ rule(r.sigmaPtRule) }}</td>
                  <td class="num" [attr.data-testid]="'sigma-' + r.itemCode + '-' + r.measurandKey">
                    {{ fix(r.sigmaPt, r.decimals + 2) }}
                  </td>
                  <td class="num">{{ counts(r).acceptable }}</td>
                  <td class="num">{{ counts(r).warning }}</td>
                  <td
                    class="num"
                    [attr.data-testid]="'action-' + r.itemCode + '-' + r.measurandKey"
                  >
                    {{ counts(r).action }}
                  </td>
                  <td>{{ r.warnings.join(', ') }}</td>
                </tr>
              }
            </tbody>
          </table>
        </div>
        @if (changes().length) {
          <p data-testid="signal-changes">
            Signals that change against the stored version: {{ changes().join('; ') }}
          </p>
        }

        @if (v.roundState === 'closed' || canReissue()) {
          <h2>σ_pt rule</h2>
          <div class="form-row">
            <mat-form-field appearance="outline" subscriptSizing="dynamic"
              ><mat-label>Measurand</mat-label>
              <mat-select [(ngModel)]="oMeasurand" data-testid="override-measurand">
                @for (m of v.measurands; track m.id) {
                  <mat-option [value]="m.key">{{ m.name }}</mat-option>
                }
              </mat-select></mat-form-field
            >
            <mat-form-field appearance="outline" subscriptSizing="dynamic"
              ><mat-label>Item</mat-label>
              <mat-select [(ngModel)]="oItem"
                ><mat-option [value]="null">Every item</mat-option>
                @for (i of v.items; track i.id) {
                  <mat-option [value]="i.code">{{ i.code }}</mat-option>
                }
              </mat-select></mat-form-field
            >
            <mat-form-field appearance="outline" subscriptSizing="dynamic"
              ><mat-label>Rule</mat-label>
              <mat-select [(ngModel)]="oKind" data-testid="override-kind">
                <mat-option value="robust-sd">Robust SD s* of this round</mat-option>
                <mat-option value="percent">Percent of x_pt</mat-option>
                <mat-option value="fixed">Fixed value</mat-option>
              </mat-select></mat-form-field
            >
            @if (oKind !== 'robust-sd') {
              <mat-form-field appearance="outline" subscriptSizing="dynamic"
                ><mat-label>{{ oKind === 'percent' ? 'Percent' : 'σ_pt' }}</mat-label>
                <input matInput type="number" [(ngModel)]="oValue" data-testid="override-value"
              /></mat-form-field>
            }
            <mat-form-field appearance="outline" subscriptSizing="dynamic" class="wide"
              ><mat-label>Reason</mat-label>
              <input matInput [(ngModel)]="oReason" data-testid="override-reason"
            /></mat-form-field>
            <button
              mat-stroked-button
              type="button"
              (click)="addOverride()"
              data-testid="add-override"
            >
              Apply
            </button>
          </div>
          @for (o of overrides(); track $index) {
            <p>
              {{ measurandName(o.measurandKey) }} · {{ o.itemCode ?? 'every item' }}:
              {{ rule(o.rule) }} — {{ o.reason }}
              <button
                mat-icon-button
                type="button"
                [attr.aria-label]="'Remove σ_pt rule for ' + measurandName(o.measurandKey)"
                (click)="removeOverride($index)"
              >
                <mat-icon>close</mat-icon>
              </button>
            </p>
          }

          <h2>Exclusions from the assigned value</h2>
          <div class="form-row">
            <mat-form-field appearance="outline" subscriptSizing="dynamic"
              ><mat-label>Participant code</mat-label>
              <input matInput [(ngModel)]="xCode" data-testid="exclude-code"
            /></mat-form-field>
            <mat-form-field appearance="outline" subscriptSizing="dynamic"
              ><mat-label>Item</mat-label>
              <mat-select [(ngModel)]="xItem" data-testid="exclude-item">
                @for (i of v.items; track i.id) {
                  <mat-option [value]="i.code">{{ i.code }}</mat-option>
                }
              </mat-select></mat-form-field
            >
            <mat-form-field appearance="outline" subscriptSizing="dynamic"
              ><mat-label>Measurand</mat-label>
              <mat-select [(ngModel)]="xMeasurand" data-testid="exclude-measurand">
                @for (m of v.measurands; track m.id) {
                  <mat-option [value]="m.key">{{ m.name }}</mat-option>
                }
              </mat-select></mat-form-field
            >
            <mat-form-field appearance="outline" subscriptSizing="dynamic"
              ><mat-label>Rule</mat-label>
              <mat-select [(ngModel)]="xRule" data-testid="exclude-rule">
                @for (r of exclusionRules; track r) {
                  <mat-option [value]="r">{{ exclusionLabels[r] }}</mat-option>
                }
              </mat-select></mat-form-field
            >
            <mat-form-field appearance="outline" subscriptSizing="dynamic" class="wide"
              ><mat-label>Reason</mat-label>
              <input matInput [(ngModel)]="xReason" data-testid="exclude-reason"
            /></mat-form-field>
            <button
              mat-stroked-button
              type="button"
              (click)="addExclusion()"
              data-testid="add-exclusion"
            >
              Exclude
            </button>
          </div>
          @for (x of exclusions(); track $index) {
            <p>
              {{ x.participantCode }} · {{ x.itemCode }} · {{ measurandName(x.measurandKey) }}:
              {{ exclusionLabels[x.rule] }} — {{ x.reason }}
              <button
                mat-icon-button
                type="button"
                [attr.aria-label]="'Remove exclusion of ' + x.participantCode"
                (click)="removeExclusion($index)"
              >
                <mat-icon>close</mat-icon>
              </button>
            </p>
          }
        }
        <h2>Comments on the round</h2>
        <p class="note">
          Printed in the round report. They can be changed until the evaluation is published.
        </p>
        <div class="form-row">
          <mat-form-field appearance="outline" subscriptSizing="dynamic" class="wide"
            ><mat-label>Coordinator’s comments on the round</mat-label>
            <textarea
              matInput
              rows="3"
              maxlength="4000"
              [(ngModel)]="comments"
              [readonly]="!commentsEditable()"
              data-testid="round-comments"
            ></textarea>
          </mat-form-field>
          @if (commentsEditable()) {
            <button
              mat-stroked-button
              type="button"
              (click)="saveComments()"
              data-testid="save-comments"
            >
              Save comments
            </button>
          }
        </div>
        @if (canReissue()) {
          <h2>Reissue</h2>
          <p class="note">
            A published evaluation never changes. A correction is a new version with a reason,
            approved for publication at once; publishing it e-mails every enrolled lab again with
            the reason, and the round is Published again.
          </p>
          <div class="form-row">
            <mat-form-field appearance="outline" subscriptSizing="dynamic" class="wide"
              ><mat-label>Reason for the correction</mat-label>
              <input matInput [(ngModel)]="reissueReason" data-testid="reissue-reason"
            /></mat-form-field>
            <button mat-stroked-button type="button" (click)="reissue()" data-testid="reissue">
              Reissue with these settings
            </button>
          </div>
        }
      }
    </section>
  `,
})
export class EvaluationPage implements OnInit {
  readonly id = input.required<string>();
  private readonly service = inject(BoardService);
  protected readonly view = signal<EvaluationView | null>(null);
  protected readonly missing = signal(false);
  protected readonly error = signal<string | null>(null);
  protected readonly message = signal<string | null>(null);
  protected readonly overrides = signal<SigmaPtOverride[]>([]);
  protected readonly exclusions = signal<Exclusion[]>([]);
  protected readonly exclusionRules = EXCLUSION_RULES;
  protected readonly exclusionLabels = EXCLUSION_RULE_LABELS;
  protected readonly evaluationStateLabels = EVALUATION_STATE_LABELS;
  /** A published round, or one left in Reissued without an approved new version, is corrected here. */
  protected readonly canReissue = computed(() => {
    const v = this.view();
    return (
      !!v &&
      (v.roundState === 'published' || (v.roundState === 'reissued' && v.state !== 'committed'))
    );
  });
  protected oMeasurand = '';
  protected oItem: string | null = null;
  protected oKind: 'robust-sd' | 'percent' | 'fixed' = 'percent';
  protected oValue: number | null = null;
  protected oReason = '';
  protected xCode = '';
  protected xItem = '';
  protected xMeasurand = '';
  protected xRule: Exclusion['rule'] = 'confirmed-blunder';
  protected xReason = '';
  protected reissueReason = '';
  private readonly provider = inject(ProviderService);
  protected comments = '';
  protected readonly commentsEditable = signal(false);

  private readonly replicates = computed<ReplicateInput[]>(() => {
    const v = this.view();
    if (!v) return [];
    return v.inputs.flatMap((g) =>
      g.rows.map((r) => ({
        code: r.code,
        testItemId: g.testItemId,
        measurandId: g.measurandId,
        values: r.values,
        uncertainty: r.uncertainty,
      })),
    );
  });

  /** The live preview: the shared engine on the stored replicates with the settings on screen. */
  protected readonly preview = computed<ItemMeasurandEvaluation[]>(() => {
    const v = this.view();
    if (!v) return [];
    return evaluateRecord({
      items: v.items,
      measurands: v.measurands,
      replicates: this.replicates(),
      settings: { sigmaPtOverrides: this.overrides(), exclusions: this.exclusions() },
    });
  });

  protected readonly dirty = computed(() => {
    const v = this.view();
    return (
      !!v &&
      JSON.stringify(v.settings) !==
        JSON.stringify({ sigmaPtOverrides: this.overrides(), exclusions: this.exclusions() })
    );
  });

  protected readonly changes = computed(() => {
    const v = this.view();
    if (!v) return [];
    const out: string[] = [];
    this.preview().forEach((r, gi) => {
      const stored = new Map(v.results[gi]?.participants.map((p) => [p.code, p.signal]) ?? []);
      for (const p of r.participants) {
        const was = stored.get(p.code);
        if (was !== undefined && was !== p.signal)
          out.push(`${p.code} ${r.itemCode}/${r.measurandKey}: ${was ?? '—'} → ${p.signal ?? '—'}`);
      }
    });
    return out.slice(0, 50);
  });

  ngOnInit(): void {
    this.service.evaluation(this.id()).subscribe({
      next: (v) => this.show(v),
      error: (e: unknown) => {
        if (e instanceof HttpErrorResponse && e.status === 404) this.missing.set(true);
        else this.error.set(problemMessage(e));
      },
    });
  }

  private show(v: EvaluationView): void {
    this.provider.comments(this.id()).subscribe({
      next: (c) => {
        this.comments = c.comments;
        this.commentsEditable.set(c.editable);
      },
      error: () => this.commentsEditable.set(false),
    });
    this.view.set(v);
    this.missing.set(false);
    this.overrides.set(v.settings.sigmaPtOverrides);
    this.exclusions.set(v.settings.exclusions);
    this.oMeasurand ||= v.measurands[0]?.key ?? '';
    this.xMeasurand ||= v.measurands[0]?.key ?? '';
    this.xItem ||= v.items[0]?.code ?? '';
  }

  protected stateLabel(s: string): string {
    return ROUND_STATE_LABELS[s as RoundState] ?? s;
  }
  protected measurandName(key: string): string {
    return this.view()?.measurands.find((m) => m.key === key)?.name ?? key;
  }
  protected rule(r: SigmaPtRuleInput): string {
    return ruleText(r);
  }
  protected counts(r: ItemMeasurandEvaluation): Counts {
    return count(r);
  }
  protected fix(v: number | null, d: number): string {
    return v === null ? '—' : v.toFixed(Math.min(8, Math.max(0, d)));
  }
  protected changedGroup(gi: number): boolean {
    const v = this.view();
    const p = this.preview()[gi];
    const s = v?.results[gi];
    return !!p && !!s && (p.sigmaPt !== s.sigmaPt || p.assignedValue !== s.assignedValue);
  }

  protected addOverride(): void {
    const rule: SigmaPtRuleInput =
      this.oKind === 'robust-sd'
        ? { kind: 'robust-sd' }
        : this.oKind === 'percent'
          ? { kind: 'percent', percent: Number(this.oValue) }
          : { kind: 'fixed', value: Number(this.oValue) };
    const candidate = {
      measurandKey: this.oMeasurand,
      itemCode: this.oItem,
      rule,
      reason: this.oReason,
    };
    const parsed = SigmaPtOverride.safeParse(candidate);
    if (!parsed.success) {
      const i = parsed.error.issues[0];
      this.error.set(
        `${i?.path.length ? fieldLabel(i.path.map(String).join('.')) : 'σ_pt rule'}: ${i?.message ?? 'check the value'}`,
      );
      return;
    }
    this.error.set(null);
    this.overrides.update((l) => [
      ...l.filter(
        (o) => !(o.measurandKey === candidate.measurandKey && o.itemCode === candidate.itemCode),
      ),
      parsed.data,
    ]);
  }
  protected removeOverride(i: number): void {
    this.overrides.update((l) => l.filter((_, j) => j !== i));
  }
  protected addExclusion(): void {
    const parsed = Exclusion.safeParse({
      participantCode: this.xCode.trim(),
      itemCode: this.xItem,
      measurandKey: this.xMeasurand,
      rule: this.xRule,
      reason: this.xReason,
    });
    if (!parsed.success) {
      const i = parsed.error.issues[0];
      this.error.set(
        `${i?.path.length ? fieldLabel(i.path.map(String).join('.')) : 'Exclusion'}: ${i?.message ?? 'check the fields'}`,
      );
      return;
    }
    if (!this.replicates().some((r) => r.code === parsed.data.participantCode)) {
      this.error.set(
        `Participant code: no result from ${parsed.data.participantCode} in this round.`,
      );
      return;
    }
    this.error.set(null);
    this.exclusions.update((l) => [...l, parsed.data]);
  }
  protected removeExclusion(i: number): void {
    this.exclusions.update((l) => l.filter((_, j) => j !== i));
  }

  private settings() {
    return { sigmaPtOverrides: this.overrides(), exclusions: this.exclusions() };
  }
  private done(text: string) {
    return {
      next: (v: EvaluationView) => {
        this.show(v);
        this.error.set(null);
        this.message.set(text);
      },
      error: (e: unknown) => this.error.set(problemMessage(e)),
    };
  }
  protected save(): void {
    this.service.evaluate(this.id(), this.settings()).subscribe(this.done('Draft saved.'));
  }
  protected commit(): void {
    this.service
      .commit(this.id())
      .subscribe(this.done('Evaluation approved for publication: the round is evaluated.'));
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
  protected saveComments(): void {
    this.provider.saveComments(this.id(), this.comments).subscribe({
      next: (c) => {
        this.comments = c.comments;
        this.commentsEditable.set(c.editable);
        this.error.set(null);
        this.message.set('Comments saved; the round report prints them.');
      },
      error: (e: unknown) => this.error.set(problemMessage(e)),
    });
  }
  protected reissue(): void {
    this.service
      .reissue(this.id(), this.reissueReason, this.settings())
      .subscribe(this.done('Reissued as a new version; publish it to inform the labs.'));
  }
}
