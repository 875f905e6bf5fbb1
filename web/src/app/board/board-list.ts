import { ChangeDetectionStrategy, Component, type OnInit, inject, signal } from '@angular/core';
import { Router, RouterLink } from '@angular/router';
import type { ICellRendererAngularComp } from 'ag-grid-angular';
import type { ColDef, ICellRendererParams } from 'ag-grid-community';
import { EVALUATION_STATE_LABELS, type BoardListEntry } from '@ringlet/shared/contracts/evaluation';
import { ROUND_STATE_LABELS, type RoundState } from '@ringlet/shared/contracts/round-states';
import { AuthService } from '../core/auth-service';
import { SignalBadge, type SignalKind } from '../core/signal-badge';
import { ActionCell, type RowAction } from '../grid/action-cell';
import { PageGrid } from '../shared/page-grid';
import './board-grid';
import { BoardService } from './board-service';

/** Grid cell: a signal count as shape + number + colour (the header carries the word). */
@Component({
  selector: 'app-signal-count-cell',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [SignalBadge],
  template: `@if (count() === null) {
      <span aria-label="no evaluation">—</span>
    } @else {
      <app-signal-badge [signal]="kind()" [label]="'' + count()" />
    }`,
})
export class SignalCountCell implements ICellRendererAngularComp {
  protected readonly kind = signal<SignalKind>('acceptable');
  protected readonly count = signal<number | null>(null);
  agInit(params: ICellRendererParams<BoardListEntry> & { kind: SignalKind }): void {
    this.kind.set(params.kind);
    this.refresh(params);
  }
  refresh(params: ICellRendererParams<BoardListEntry>): boolean {
    this.count.set(params.data?.evaluationState ? (params.value as number) : null);
    return true;
  }
}

/** Rounds whose Consensus board the user may open, with their signal counts and the next step for each role. */
@Component({
  selector: 'app-board-list',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [PageGrid, RouterLink],
  template: `
    <section class="page">
      <h1 data-testid="page-heading">Consensus board</h1>
      <p class="page-actions"><a routerLink="/board/investigations">Investigations</a></p>
      @if (!loading() && rounds().length === 0) {
        <p>No round has results to show yet.</p>
      } @else {
        <app-page-grid
          [rows]="rounds()"
          [columns]="columns"
          [rowIdOf]="rowId"
          [loading]="loading()"
          label="Rounds"
          testId="board-rounds"
        />
      }
    </section>
  `,
})
export class BoardList implements OnInit {
  private readonly service = inject(BoardService);
  private readonly auth = inject(AuthService);
  private readonly router = inject(Router);
  protected readonly rounds = signal<BoardListEntry[]>([]);
  protected readonly loading = signal(true);
  protected readonly rowId = (p: { data: BoardListEntry }) => p.data.roundId;

  private readonly actions: RowAction<BoardListEntry>[] = [
    {
      label: 'Board',
      ariaLabel: (r) => `Open the Consensus board of ${r.roundCode}`,
      run: (r) => this.open(r, r.evaluationState ? [] : ['evaluation']),
    },
    ...(this.auth.hasRole('coordinator')
      ? [
          {
            label: 'Evaluation',
            ariaLabel: (r: BoardListEntry) => `Open the evaluation of ${r.roundCode}`,
            run: (r: BoardListEntry) => this.open(r, ['evaluation']),
          },
        ]
      : []),
    ...(this.auth.hasRole('lab')
      ? [
          {
            label: 'My scores',
            ariaLabel: (r: BoardListEntry) => `My scores in ${r.roundCode}`,
            run: (r: BoardListEntry) => this.open(r, ['scores']),
          },
        ]
      : []),
  ];

  private count(kind: SignalKind, header: string): ColDef<BoardListEntry> {
    return {
      field: kind,
      headerName: header,
      width: 100,
      type: 'rightAligned',
      cellRenderer: SignalCountCell,
      cellRendererParams: { kind },
    };
  }

  protected readonly columns: ColDef<BoardListEntry>[] = [
    {
      field: 'roundCode',
      headerName: 'Round',
      width: 110,
      pinned: 'left',
      filter: 'agTextColumnFilter',
    },
    {
      field: 'roundTitle',
      headerName: 'Title',
      flex: 1,
      minWidth: 140,
      filter: 'agTextColumnFilter',
    },
    {
      field: 'roundState',
      headerName: 'State',
      width: 100,
      valueFormatter: ({ value }) => ROUND_STATE_LABELS[value as RoundState] ?? String(value),
    },
    {
      colId: 'evaluation',
      headerName: 'Evaluation',
      width: 170,
      valueGetter: ({ data }) =>
        data?.evaluationState
          ? `${EVALUATION_STATE_LABELS[data.evaluationState]}, v${data.version}`
          : 'Not evaluated yet',
    },
    this.count('acceptable', 'Acceptable'),
    this.count('warning', 'Warning'),
    this.count('action', 'Action'),
    {
      colId: 'actions',
      headerName: '',
      width: 200,
      sortable: false,
      cellRenderer: ActionCell,
      cellRendererParams: { actions: this.actions },
    },
  ];

  private open(r: BoardListEntry, tail: string[]): void {
    void this.router.navigate(['/board/rounds', r.roundId, ...tail]);
  }

  ngOnInit(): void {
    this.service.boards().subscribe({
      next: (r) => {
        this.rounds.set(r);
        this.loading.set(false);
      },
      error: () => this.loading.set(false),
    });
  }
}
