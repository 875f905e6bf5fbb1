import './board-grid';
import {
  ChangeDetectionStrategy,
  Component,
  type OnInit,
  computed,
  inject,
  input,
  signal,
} from '@angular/core';
import { FormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';
import { MatSlideToggleModule } from '@angular/material/slide-toggle';
import { RouterLink } from '@angular/router';
import { AgGridAngular } from 'ag-grid-angular';
import type {
  ColDef,
  ColGroupDef,
  GridApi,
  GridReadyEvent,
  RowClassParams,
  RowStyle,
} from 'ag-grid-community';
import type { BoardData, BoardRow } from '@ringlet/shared/contracts/evaluation';
import { AuthService } from '../core/auth-service';
import { problemMessage } from '../core/problem';
import { ringletGridTheme, safeCsvCell } from './board-grid';
import { chartsFor } from './board-charts';
import { BoardService } from './board-service';
import { ChartPanel } from './chart-panel';
import { SignalCell } from './signal-cell';

interface GridRow extends BoardRow {
  lab: string;
  own: boolean;
}

const HINT_WORDS: Record<string, string> = {
  'radius-diameter': 'radius/diameter?',
  'unit-slip': 'unit?',
  'viscosity-temperature': 'viscosity/temperature?',
  'dust-aggregates': 'dust?',
};

/** The Consensus board: one row per participant code, per item × measurand results and scores, charts below. */
@Component({
  selector: 'app-board-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [
    AgGridAngular,
    FormsModule,
    MatButtonModule,
    MatIconModule,
    MatFormFieldModule,
    MatInputModule,
    MatSelectModule,
    MatSlideToggleModule,
    RouterLink,
    ChartPanel,
  ],
  styleUrl: './board.scss',
  template: `
    <section class="page">
      <h1 data-testid="page-heading">
        Consensus board{{ board() ? ': ' + board()!.roundCode : '' }}
      </h1>
      @if (error()) {
        <p class="form-error" role="alert">{{ error() }}</p>
      }
      @if (board(); as b) {
        <p class="note">
          {{ b.roundTitle }} · evaluation version {{ b.version }} ({{ b.state }}) ·
          {{ b.rows.length }} participants. Labs appear by participant code only{{
            b.ownCodes.length ? '; your row is marked “your lab”' : ''
          }}.
        </p>
        <div class="toolbar">
          <mat-form-field appearance="outline" subscriptSizing="dynamic">
            <mat-label>Filter rows</mat-label>
            <input
              matInput
              [ngModel]="quick()"
              (ngModelChange)="quick.set($event)"
              data-testid="board-filter"
            />
          </mat-form-field>
          @if (b.canRevealNames) {
            <mat-slide-toggle
              [checked]="reveal()"
              (change)="toggleNames($event.checked)"
              data-testid="reveal-names"
              >Show lab names</mat-slide-toggle
            >
            <a mat-button [routerLink]="['/board/rounds', b.roundId, 'evaluation']">Evaluation</a>
          }
          @if (b.ownCodes.length) {
            <a mat-button [routerLink]="['/board/rounds', b.roundId, 'scores']">My scores</a>
          }
          <button mat-stroked-button type="button" (click)="exportCsv()" data-testid="export-csv">
            <mat-icon>download</mat-icon> Export CSV
          </button>
        </div>
        <ag-grid-angular
          class="board-grid"
          [theme]="theme"
          [loadThemeGoogleFonts]="false"
          [rowData]="rows()"
          [columnDefs]="columns()"
          [defaultColDef]="defaultCol"
          [getRowId]="rowId"
          [getRowStyle]="rowStyle"
          [quickFilterText]="quick()"
          [suppressColumnVirtualisation]="false"
          (gridReady)="onReady($event)"
          aria-label="Consensus board"
          data-testid="board-grid"
        />
        <h2>Charts</h2>
        <mat-form-field appearance="outline" subscriptSizing="dynamic">
          <mat-label>Item and measurand</mat-label>
          <mat-select [value]="group()" (valueChange)="group.set($event)" data-testid="chart-group">
            @for (g of b.groups; track $index) {
              <mat-option [value]="$index">{{ g.itemCode }} · {{ g.measurandName }}</mat-option>
            }
          </mat-select>
        </mat-form-field>
        <div class="charts">
          @for (c of charts(); track c.name) {
            <app-chart-panel
              [name]="c.name"
              [caption]="c.caption"
              [option]="c.option"
              [text]="c.text"
              [table]="c.table"
            />
          }
        </div>
      } @else if (!error()) {
        <p>Loading…</p>
      }
    </section>
  `,
})
export class BoardPage implements OnInit {
  readonly id = input.required<string>();
  private readonly service = inject(BoardService);
  protected readonly auth = inject(AuthService);
  protected readonly theme = ringletGridTheme;
  protected readonly board = signal<BoardData | null>(null);
  protected readonly error = signal<string | null>(null);
  protected readonly reveal = signal(false);
  protected readonly quick = signal('');
  protected readonly group = signal(0);
  private api: GridApi<GridRow> | null = null;

  protected readonly defaultCol: ColDef = {
    sortable: true,
    resizable: true,
    filter: 'agNumberColumnFilter',
    width: 92,
  };
  protected readonly rowId = (p: { data: GridRow }) => p.data.code;
  protected readonly rowStyle = (p: RowClassParams<GridRow>): RowStyle | undefined =>
    p.data?.own ? { fontWeight: '600', background: '#e3f1ef' } : undefined;

  protected readonly rows = computed<GridRow[]>(() => {
    const b = this.board();
    if (!b) return [];
    const own = new Set(b.ownCodes);
    return b.rows.map((r) => ({ ...r, lab: b.labNames[r.code] ?? '', own: own.has(r.code) }));
  });

  protected readonly columns = computed<(ColDef<GridRow> | ColGroupDef<GridRow>)[]>(() => {
    const b = this.board();
    if (!b) return [];
    const cols: (ColDef<GridRow> | ColGroupDef<GridRow>)[] = [
      {
        field: 'code',
        headerName: 'Participant code',
        pinned: 'left',
        width: 160,
        filter: 'agTextColumnFilter',
        sort: 'asc',
        valueFormatter: (p) => (p.data?.own ? `${p.value} (your lab)` : String(p.value)),
      },
    ];
    if (Object.keys(b.labNames).length > 0) {
      cols.push({
        field: 'lab',
        headerName: 'Lab',
        pinned: 'left',
        width: 180,
        filter: 'agTextColumnFilter',
      });
    }
    b.groups.forEach((g, gi) => {
      const unit = g.unit ? ` (${g.unit})` : '';
      const num = (digits: number) => (p: { value: number | null | undefined }) =>
        p.value === null || p.value === undefined ? '—' : p.value.toFixed(digits);
      const cell = (r: GridRow | undefined) => r?.cells[gi] ?? null;
      const scoreName = g.scoreKind === 'z' ? 'z' : 'z′';
      cols.push({
        headerName: `${g.itemCode} · ${g.measurandName}${unit}`,
        marryChildren: true,
        children: [
          {
            colId: `g${gi}-result`,
            headerName: `Result${unit}`,
            type: 'rightAligned',
            valueGetter: (p) => cell(p.data)?.result ?? null,
            valueFormatter: num(g.decimals),
          },
          {
            colId: `g${gi}-sd`,
            headerName: 'Replicate SD',
            type: 'rightAligned',
            valueGetter: (p) => cell(p.data)?.sd ?? null,
            valueFormatter: num(g.decimals + 1),
          },
          {
            colId: `g${gi}-score`,
            headerName: scoreName,
            type: 'rightAligned',
            valueGetter: (p) => {
              const c = cell(p.data);
              return c ? (g.scoreKind === 'z' ? c.z : c.zPrime) : null;
            },
            valueFormatter: num(2),
          },
          {
            colId: `g${gi}-zeta`,
            headerName: 'ζ',
            type: 'rightAligned',
            width: 74,
            valueGetter: (p) => cell(p.data)?.zeta ?? null,
            valueFormatter: num(2),
          },
          {
            colId: `g${gi}-en`,
            headerName: 'En',
            type: 'rightAligned',
            width: 74,
            valueGetter: (p) => cell(p.data)?.en ?? null,
            valueFormatter: num(2),
          },
          {
            colId: `g${gi}-signal`,
            headerName: 'Signal',
            width: 122,
            filter: 'agTextColumnFilter',
            valueGetter: (p) => cell(p.data)?.signal ?? null,
            cellRenderer: SignalCell,
          },
          {
            colId: `g${gi}-hints`,
            headerName: 'Hints',
            width: 150,
            filter: 'agTextColumnFilter',
            valueGetter: (p) => {
              const c = cell(p.data);
              if (!c) return '';
              return [
                ...(c.notScored ? [c.notScored] : []),
                ...(c.hints ?? []).map((h) => HINT_WORDS[h] ?? h),
                ...(c.excluded ? ['excluded from x_pt'] : []),
              ].join('; ');
            },
          },
        ],
      });
    });
    return cols;
  });

  protected readonly charts = computed(() => {
    const b = this.board();
    return b ? chartsFor(b, this.group()) : [];
  });

  ngOnInit(): void {
    this.load();
  }

  private load(): void {
    this.service.board(this.id(), this.reveal()).subscribe({
      next: (b) => {
        this.board.set(b);
        this.error.set(null);
      },
      error: (e: unknown) => this.error.set(problemMessage(e)),
    });
  }

  protected toggleNames(on: boolean): void {
    this.reveal.set(on);
    this.load();
  }

  protected onReady(e: GridReadyEvent<GridRow>): void {
    this.api = e.api;
  }

  protected exportCsv(): void {
    const b = this.board();
    this.api?.exportDataAsCsv({
      fileName: `${b?.roundCode ?? 'board'}-v${b?.version ?? ''}-consensus-board.csv`,
      processCellCallback: (p) => String(safeCsvCell(p.value ?? '')),
    });
  }
}
