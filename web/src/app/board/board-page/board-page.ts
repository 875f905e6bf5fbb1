import '../board-grid';
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
import { MatSlideToggleModule } from '@angular/material/slide-toggle';
import { RouterLink } from '@angular/router';
import { AgGridAngular } from 'ag-grid-angular';
import type { ColDef, GridApi, GridReadyEvent, RowClassParams, RowStyle } from 'ag-grid-community';
import { BoardChartSection } from '../board-chart-section/board-chart-section';
import { type BoardGridRow, boardColumns, boardRows } from '../board-columns';
import { ringletGridTheme, safeCsvCell } from '../board-grid';
import { PageLoad } from '../../shared/page-load';
import { BoardService } from '../board-service';

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
    MatSlideToggleModule,
    RouterLink,
    BoardChartSection,
  ],
  styleUrl: '../board.scss',
  templateUrl: './board-page.html',
})
export class BoardPage implements OnInit {
  readonly id = input.required<string>();
  private readonly service = inject(BoardService);
  protected readonly theme = ringletGridTheme;
  private readonly page = new PageLoad(() => this.service.board(this.id(), this.reveal()));
  protected readonly board = this.page.value;
  protected readonly error = this.page.error;
  protected readonly reveal = signal(false);
  protected readonly quick = signal('');
  private api: GridApi<BoardGridRow> | null = null;

  protected readonly defaultCol: ColDef = {
    sortable: true,
    resizable: true,
    filter: 'agNumberColumnFilter',
    width: 92,
  };
  protected readonly rowId = (p: { data: BoardGridRow }) => p.data.code;
  protected readonly rowStyle = (p: RowClassParams<BoardGridRow>): RowStyle | undefined =>
    p.data?.own ? { fontWeight: '600', background: '#e3f1ef' } : undefined;

  protected readonly rows = computed(() => {
    const b = this.board();
    return b ? boardRows(b) : [];
  });
  protected readonly columns = computed(() => {
    const b = this.board();
    return b ? boardColumns(b) : [];
  });

  ngOnInit(): void {
    this.page.load();
  }

  protected toggleNames(on: boolean): void {
    this.reveal.set(on);
    this.page.load();
  }

  protected onReady(e: GridReadyEvent<BoardGridRow>): void {
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
