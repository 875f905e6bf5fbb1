import {
  ChangeDetectionStrategy,
  Component,
  type OnInit,
  computed,
  inject,
  input,
  signal,
} from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatButtonToggleModule } from '@angular/material/button-toggle';
import { MatDialog } from '@angular/material/dialog';
import { RouterLink } from '@angular/router';
import type { PrecisionAnalysis, PrecisionExclusion } from '@ringlet/shared/contracts/precision';
import { ROUND_STATE_LABELS } from '@ringlet/shared/contracts/round-states';
import { analysePrecisionStudy } from '@ringlet/shared/evaluation/precision-study';
import { problemMessage } from '../core/problem';
import { ReportDownloads } from '../reports/report-downloads';
import { PageLoad } from '../shared/page-load';
import { DecisionDialog, type DecisionDialogData, type DecisionResult } from './decision-dialog';
import { DecisionsList } from './decisions-list';
import { FinishDialog, type FinishDialogData } from './finish-dialog';
import { FitPanel } from './fit-panel';
import { LevelPanel } from './level-panel';
import { PendingList } from './pending-list';
import { PrecisionService } from './precision-service';
import {
  fix,
  inputFromAnalysis,
  pendingCells,
  withDecisions,
  type PendingCell,
} from './precision-view';
import { ReferencesDialog, type ReferencesDialogData } from './references-dialog';
import { SummaryGrid } from './summary-grid';
import { WithdrawDialog, type WithdrawDialogData } from './withdraw-dialog';

/**
 * The coordinator's precision study (ISO 5725-2): per level and measurand the cells, s_r, s_L,
 * s_R, r and R, Mandel's h and k, Cochran's and Grubbs' tests, the level dependence and the bias.
 * A decision on a flagged cell is applied at once in the browser (the shared analysis function),
 * then stored; the server's answer replaces the local one.
 */
@Component({
  selector: 'app-precision-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [
    RouterLink,
    MatButtonModule,
    MatButtonToggleModule,
    ReportDownloads,
    DecisionsList,
    FitPanel,
    LevelPanel,
    PendingList,
    SummaryGrid,
  ],
  templateUrl: './precision-page.html',
  styleUrl: './precision.scss',
})
export class PrecisionPage implements OnInit {
  /** Route parameter (component input binding). */
  readonly id = input.required<string>();
  private readonly service = inject(PrecisionService);
  private readonly dialog = inject(MatDialog);
  protected readonly stateLabels = ROUND_STATE_LABELS;
  private readonly page = new PageLoad(() => this.service.analysis(this.id()));
  protected readonly stored = this.page.value;
  /** Decisions recorded here and not yet answered by the server. */
  protected readonly unsaved = signal<DecisionResult[]>([]);
  protected readonly loadError = this.page.error;
  protected readonly error = signal<string | null>(null);
  protected readonly message = signal<string | null>(null);
  protected readonly chosenKey = signal<string | null>(null);

  /** What the page shows: the stored analysis, recomputed here with the unsaved decisions. */
  protected readonly analysis = computed<PrecisionAnalysis | null>(() => {
    const s = this.stored();
    const u = this.unsaved();
    if (!s || u.length === 0) return s;
    return analysePrecisionStudy(withDecisions(inputFromAnalysis(s), u));
  });
  protected readonly measurand = computed(() => {
    const a = this.analysis();
    return a?.measurands.find((m) => m.key === this.chosenKey()) ?? a?.measurands[0] ?? null;
  });
  protected readonly pending = computed(() => {
    const a = this.analysis();
    return a ? pendingCells(a) : [];
  });
  protected readonly measurandLabels = computed(() =>
    Object.fromEntries(this.analysis()?.measurands.map((m) => [m.key, m.label]) ?? []),
  );
  protected readonly levelLabels = computed(() =>
    Object.fromEntries(this.measurand()?.levels.map((l) => [l.itemCode, l.itemLabel]) ?? []),
  );

  /** Reference values can change until the study is finished (Evaluated and after). */
  protected finished(a: PrecisionAnalysis): boolean {
    return ['evaluated', 'published', 'reissued'].includes(a.round.state);
  }

  protected count(n: number, one: string, many: string): string {
    return `${n} ${n === 1 ? one : many}`;
  }

  ngOnInit(): void {
    this.page.load();
  }

  protected openDecision(cell: PendingCell): void {
    const m = this.analysis()?.measurands.find((x) => x.key === cell.measurandKey);
    const c = m?.levels
      .find((l) => l.itemCode === cell.itemCode)
      ?.cells.find((x) => x.participantCode === cell.participantCode);
    const suspect = c?.replicates.find((r) => r.replicate === cell.suspectReplicate);
    const data: DecisionDialogData = {
      cell,
      suspectValue: suspect && m ? `${fix(suspect.value, m.decimals)} ${m.unit}`.trim() : null,
    };
    this.dialog
      .open<DecisionDialog, DecisionDialogData, DecisionResult>(DecisionDialog, {
        data,
        width: '560px',
        maxWidth: '95vw',
      })
      .afterClosed()
      .subscribe((d) => {
        if (d) this.record(d);
      });
  }

  /** Shows the decision at once, then stores it; a refusal takes it back and says why. */
  private record(d: DecisionResult): void {
    this.error.set(null);
    this.message.set(null);
    this.unsaved.update((l) => [...l, d]);
    const drop = () => this.unsaved.update((l) => l.filter((x) => x !== d));
    this.service.decide(this.id(), [d]).subscribe({
      next: (a) => {
        drop();
        this.stored.set(a);
        this.message.set(`Decision on ${d.participantCode} stored.`);
      },
      error: (e: unknown) => {
        drop();
        this.error.set(`The decision on ${d.participantCode} was not stored: ${problemMessage(e)}`);
      },
    });
  }

  /** Reference values per level × measurand; the answer (with the bias) replaces the page's. */
  protected openReferences(): void {
    const a = this.stored();
    if (!a) return;
    this.dialog
      .open<ReferencesDialog, ReferencesDialogData, PrecisionAnalysis>(ReferencesDialog, {
        data: { roundId: this.id(), analysis: a },
        width: '760px',
        maxWidth: '95vw',
      })
      .afterClosed()
      .subscribe((r) => this.answered(r, 'Reference values stored.'));
  }

  protected openFinish(): void {
    this.dialog
      .open<FinishDialog, FinishDialogData, PrecisionAnalysis>(FinishDialog, {
        data: { roundId: this.id() },
        width: '480px',
        maxWidth: '95vw',
      })
      .afterClosed()
      .subscribe((r) => this.answered(r, 'The study is finished.'));
  }

  /** Withdraws a decision in force with a reason, then reloads the analysis. */
  protected openWithdraw(decision: PrecisionExclusion): void {
    this.dialog
      .open<WithdrawDialog, WithdrawDialogData, PrecisionAnalysis>(WithdrawDialog, {
        data: { roundId: this.id(), decision },
        width: '560px',
        maxWidth: '95vw',
      })
      .afterClosed()
      .subscribe((r) => {
        if (!r) return;
        this.answered(r, `Decision on ${decision.participantCode} withdrawn.`);
        this.page.load();
      });
  }

  private answered(a: PrecisionAnalysis | undefined, message: string): void {
    if (!a) return;
    this.error.set(null);
    this.stored.set(a);
    this.message.set(message);
  }
}
