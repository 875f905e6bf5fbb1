import {
  ChangeDetectionStrategy,
  Component,
  OnInit,
  computed,
  inject,
  input,
  signal,
} from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatDialog } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';
import { RouterLink } from '@angular/router';
import { AgGridAngular } from 'ag-grid-angular';
import type { ColDef } from 'ag-grid-community';
import type { Observable } from 'rxjs';
import type { Organisation } from '@ringlet/shared/contracts/admin';
import { SHIPMENT_CONDITION_LABELS, type ShipmentCondition } from '@ringlet/shared/contracts/bench';
import {
  DLS_DEFAULT_MEASURANDS,
  type Enrolment,
  type Invitation,
  InvitationsCreate,
  isDescriptionOpen,
  isDesignOpen,
  type Measurand,
  type ReceiptStatus,
  type RoundDetail as RoundDetailDto,
  type Study,
  StudyInput,
  type TestItem,
  HOMOGENEITY_DECISION_LABELS,
  type HomogeneityDecisionKind,
  STUDY_KIND_LABELS,
} from '@ringlet/shared/contracts/rounds';
import {
  describeMove,
  isDeskMove,
  ROUND_STATE_LABELS,
  ROUND_TRANSITIONS,
  type RoundState,
} from '@ringlet/shared/contracts/round-states';
import { DISPATCH_CAUTIONS } from '@ringlet/shared/contracts/safety';
import { problemMessage } from '../core/problem';
import { SignalBadge } from '../core/signal-badge';
import { errorMessage } from '../core/zod-form-errors';
import { ActionCell, type RowAction } from '../grid/action-cell';
import { FileDrop } from '../core/file-drop';
import { PrecisionStudyLink } from '../precision/precision-study-link';
import { DeskDialog, type DeskDialogData } from './desk-dialogs';
import { ItemDialog, type ItemDialogData } from './item-dialog';
import { MeasurandDialog, type MeasurandDialogData } from './measurand-dialog';
import { assignedRuleText, sigmaRuleText } from './measurand-rules';
import { RoundEditDialog } from './round-edit-dialog';
import { parseWith, showServerError } from './form-errors';
import { formatDate, formatMoney, ringletGridTheme } from './rounds-grid';
import { RoundsService } from './rounds.service';
import { parseReplicateText, studyNumbers } from './study-numbers';

const conditionLabel = (c: string | null | undefined): string =>
  c ? (SHIPMENT_CONDITION_LABELS[c as ShipmentCondition] ?? c) : '';

const RECEIPT_LABELS: Record<ReceiptStatus, string> = {
  'not-dispatched': 'Not dispatched',
  dispatched: 'Dispatched, awaiting receipt',
  received: 'Received intact',
  'received-with-problem': 'Received with a problem',
};

/** One round on the Round desk: lifecycle, items, measurands, invitations, enrolments, homogeneity. */
@Component({
  selector: 'app-round-detail',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [
    AgGridAngular,
    ReactiveFormsModule,
    MatButtonModule,
    MatIconModule,
    MatFormFieldModule,
    MatInputModule,
    MatSelectModule,
    RouterLink,
    SignalBadge,
    FileDrop,
    PrecisionStudyLink,
  ],
  template: `
    <section class="page">
      <p><a routerLink="/desk">← Round desk</a></p>
      @if (round(); as r) {
        <h1 data-testid="page-heading">{{ r.code }} · {{ r.title }}</h1>
        <p><a [routerLink]="['/billing/rounds', r.id, 'ledger']">Fees ledger</a></p>
        <p class="state-line">
          State: <strong data-testid="round-state">{{ stateLabel(r.state) }}</strong> · Scheme
          {{ r.schemeCode }} · Enrolment closes {{ formatDate(r.enrolmentClosesOn) }} · Dispatch
          {{ formatDate(r.dispatchOn) }} · Results due {{ formatDate(r.resultsDueAt, true) }} · Fee
          {{ formatMoney(r.feeMinor, r.currency) }}
        </p>
        <app-precision-study-link [round]="r" />
        <div class="page-actions">
          @if (descriptionOpen()) {
            <button mat-stroked-button type="button" data-testid="edit-round" (click)="editRound()">
              <mat-icon>edit</mat-icon> Edit round
            </button>
          }
          @for (to of nextStates(); track to) {
            <button
              [attr.data-testid]="'move-' + to"
              type="button"
              (click)="move(to)"
              [class.back-move]="moveOf(r.state, to).backwards"
              [attr.mat-stroked-button]="null"
              mat-flat-button
            >
              {{ moveOf(r.state, to).label }}
            </button>
          }
          @if (
            r.kind === 'pt' &&
            (r.state === 'closed' ||
              r.state === 'evaluated' ||
              r.state === 'published' ||
              r.state === 'reissued')
          ) {
            <span
              >Evaluation, publication and corrections (reissue) run from the
              <a [routerLink]="['/board/rounds', r.id, 'evaluation']">evaluation page</a>.</span
            >
          }
          @if (r.hasOpenHomogeneityFailure) {
            <app-signal-badge
              signal="action"
              label="Homogeneity decision needed before publication"
            />
          }
        </div>
        @if (message(); as m) {
          <p class="form-error" role="alert">{{ m }}</p>
        }

        <h2>Instructions for labs</h2>
        <pre class="instructions">{{ r.instructions }}</pre>

        <h2>Test items</h2>
        @if (designOpen()) {
          <div class="page-actions">
            <button
              mat-stroked-button
              type="button"
              data-testid="add-test-item"
              (click)="editItem()"
            >
              <mat-icon>add</mat-icon> Add test item
            </button>
          </div>
        } @else {
          <p>Test items and measurands are fixed once the round has left enrolling.</p>
        }
        <ag-grid-angular
          class="grid-small"
          [theme]="theme"
          [loadThemeGoogleFonts]="false"
          domLayout="autoHeight"
          [rowData]="r.items"
          [columnDefs]="itemColumns()"
          [getRowId]="rowId"
          aria-label="Test items"
        />

        <h2>Measurands</h2>
        @if (designOpen()) {
          <div class="page-actions">
            <button
              mat-stroked-button
              type="button"
              data-testid="add-measurand"
              (click)="editMeasurand()"
            >
              <mat-icon>add</mat-icon> Add measurand
            </button>
            @if (lacksDlsDefaults()) {
              <button
                mat-stroked-button
                type="button"
                data-testid="add-dls-defaults"
                [disabled]="busy()"
                (click)="addDlsDefaults()"
              >
                Add Z-average and PDI
              </button>
            }
          </div>
        }
        <ag-grid-angular
          class="grid-small"
          [theme]="theme"
          [loadThemeGoogleFonts]="false"
          domLayout="autoHeight"
          [rowData]="r.measurands"
          [columnDefs]="measurandColumns()"
          [getRowId]="rowId"
          aria-label="Measurands"
        />

        <h2>Invitations</h2>
        @if (r.state === 'enrolling') {
          <form
            [formGroup]="inviteForm"
            (ngSubmit)="invite()"
            novalidate
            class="invite-form"
            data-testid="invite-form"
          >
            <div formArrayName="invitations">
              @for (row of inviteForm.controls.invitations.controls; track row; let i = $index) {
                <div [formGroupName]="i" class="invite-row">
                  <mat-form-field>
                    <mat-label>Lab</mat-label>
                    <mat-select
                      formControlName="organisationId"
                      [attr.data-testid]="'invite-lab-' + i"
                    >
                      <mat-option value="">A new lab (by contact address)</mat-option>
                      @for (lab of labs(); track lab.id) {
                        <mat-option [value]="lab.id">{{ lab.name }}</mat-option>
                      }
                    </mat-select>
                  </mat-form-field>
                  @if (!row.controls.organisationId.value) {
                    <mat-form-field>
                      <mat-label>New lab name</mat-label>
                      <input matInput formControlName="labName" />
                      <mat-error>{{ errorMessage(row.controls.labName) }}</mat-error>
                    </mat-form-field>
                  }
                  <mat-form-field>
                    <mat-label>E-mail</mat-label>
                    <input matInput type="email" formControlName="email" />
                    <mat-error>{{ errorMessage(row.controls.email) }}</mat-error>
                  </mat-form-field>
                  <button
                    mat-icon-button
                    type="button"
                    [attr.aria-label]="'Remove invitation ' + (i + 1)"
                    (click)="removeInvite(i)"
                  >
                    <mat-icon>delete</mat-icon>
                  </button>
                </div>
              }
            </div>
            <button
              mat-stroked-button
              type="button"
              (click)="addInvite()"
              data-testid="add-invitation"
            >
              <mat-icon>add</mat-icon> Another lab
            </button>
            <button
              mat-flat-button
              type="submit"
              [disabled]="busy()"
              data-testid="send-invitations"
            >
              Send invitations
            </button>
            @if (inviteFailure(); as m) {
              <p class="form-error" role="alert">{{ m }}</p>
            }
          </form>
        } @else {
          <p>Invitations go out while the round is enrolling.</p>
        }
        <ag-grid-angular
          class="grid-small"
          [theme]="theme"
          [loadThemeGoogleFonts]="false"
          domLayout="autoHeight"
          [rowData]="invitations()"
          [columnDefs]="invitationColumns"
          aria-label="Invitations"
        />

        <h2>Enrolments and receipt</h2>
        <p>{{ receiptSummary() }}</p>
        <ag-grid-angular
          class="grid-small"
          [theme]="theme"
          [loadThemeGoogleFonts]="false"
          domLayout="autoHeight"
          [rowData]="enrolments()"
          [columnDefs]="enrolmentColumns"
          [getRowId]="rowId"
          aria-label="Enrolments"
        />

        <h2>Homogeneity and stability</h2>
        <form
          [formGroup]="studyForm"
          (ngSubmit)="recordStudy()"
          novalidate
          class="study-form"
          data-testid="study-form"
        >
          <div class="invite-row">
            <mat-form-field>
              <mat-label>Study</mat-label>
              <mat-select formControlName="kind">
                <mat-option value="homogeneity"
                  >Homogeneity study (g items × replicates)</mat-option
                >
                <mat-option value="stability">Stability study (before / after)</mat-option>
              </mat-select>
            </mat-form-field>
            <mat-form-field>
              <mat-label>Test item</mat-label>
              <mat-select formControlName="testItemId">
                @for (i of r.items; track i.id) {
                  <mat-option [value]="i.id">{{ i.code }} · {{ i.material }}</mat-option>
                }
              </mat-select>
              <mat-error>{{ errorMessage(studyForm.controls.testItemId) }}</mat-error>
            </mat-form-field>
            <mat-form-field>
              <mat-label>Measurand</mat-label>
              <mat-select formControlName="measurandId">
                @for (m of r.measurands; track m.id) {
                  <mat-option [value]="m.id">{{ m.name }}</mat-option>
                }
              </mat-select>
              <mat-error>{{ errorMessage(studyForm.controls.measurandId) }}</mat-error>
            </mat-form-field>
            <mat-form-field>
              <mat-label>σ_pt for the check</mat-label>
              <input matInput type="number" formControlName="sigmaPt" />
              <mat-error>{{ errorMessage(studyForm.controls.sigmaPt) }}</mat-error>
            </mat-form-field>
          </div>
          <mat-form-field class="wide">
            <mat-label>{{
              studyForm.controls.kind.value === 'homogeneity'
                ? 'One line per item: its replicate results'
                : 'Line 1: results before; line 2: results after'
            }}</mat-label>
            <textarea matInput formControlName="text" rows="5" placeholder="100.2 100.4"></textarea>
            <mat-error>{{ errorMessage(studyForm.controls.text) }}</mat-error>
          </mat-form-field>
          <div class="page-actions">
            <button mat-flat-button type="submit" [disabled]="busy()" data-testid="record-study">
              Compute and store
            </button>
            <app-file-drop
              label="Or drop a CSV or XLSX file here"
              accept=".csv,.xlsx,text/csv,application/vnd.openxmlformats-officedocument.spreadsheetml.sheet"
              [disabled]="busy()"
              (picked)="upload($event)"
              testId="study-file"
            />
          </div>
          @if (studyFailure(); as m) {
            <p class="form-error" role="alert">{{ m }}</p>
          }
        </form>
        <ag-grid-angular
          class="grid-small"
          [theme]="theme"
          [loadThemeGoogleFonts]="false"
          domLayout="autoHeight"
          [rowData]="studies()"
          [columnDefs]="studyColumns"
          aria-label="Homogeneity and stability studies"
        />

        <h2>History</h2>
        <ul class="history">
          @for (t of r.transitions; track t.at) {
            <li>
              {{ formatDate(t.at, true) }}: {{ stateLabel(t.fromState) }} →
              {{ stateLabel(t.toState) }} by {{ t.actorName ?? 'the system'
              }}{{ t.forced ? ' (closed early)' : '' }}{{ t.reason ? ' — ' + t.reason : '' }}
            </li>
          } @empty {
            <li>No transitions yet.</li>
          }
        </ul>
      } @else {
        <h1 data-testid="page-heading">Round</h1>
        <p>Loading…</p>
      }
    </section>
  `,
  styles: `
    .state-line {
      color: #1f3a5f;
    }
    .instructions {
      white-space: pre-wrap;
      font-family: inherit;
      background: #f6f8fb;
      padding: 8px 12px;
      border-radius: 6px;
    }
    .grid-small {
      width: 100%;
      margin-bottom: 12px;
    }
    .invite-row {
      display: flex;
      flex-wrap: wrap;
      gap: 8px;
      align-items: baseline;
    }
    .invite-row mat-form-field {
      flex: 1 1 200px;
    }
    .wide {
      width: 100%;
    }
    .upload {
      display: inline-flex;
      gap: 6px;
      align-items: center;
    }
    .history {
      padding-left: 18px;
    }
  `,
})
export class RoundDetail implements OnInit {
  /** Route parameter (component input binding). */
  readonly id = input.required<string>();
  private readonly api = inject(RoundsService);
  private readonly dialog = inject(MatDialog);
  private readonly fb = inject(NonNullableFormBuilder);
  protected readonly theme = ringletGridTheme;
  protected readonly errorMessage = errorMessage;
  protected readonly formatDate = formatDate;
  protected readonly formatMoney = formatMoney;
  protected readonly stateLabel = (s: RoundState) => ROUND_STATE_LABELS[s];
  protected readonly round = signal<RoundDetailDto | null>(null);
  protected readonly labs = signal<Organisation[]>([]);
  protected readonly invitations = signal<Invitation[]>([]);
  protected readonly enrolments = signal<Enrolment[]>([]);
  protected readonly studies = signal<Study[]>([]);
  protected readonly busy = signal(false);
  protected readonly message = signal<string | null>(null);
  protected readonly inviteFailure = signal<string | null>(null);
  protected readonly studyFailure = signal<string | null>(null);
  protected readonly rowId = (p: { data: { id: string } }) => p.data.id;
  protected readonly designOpen = computed(
    () => !!this.round() && isDesignOpen(this.round()!.state),
  );
  protected readonly descriptionOpen = computed(
    () => !!this.round() && isDescriptionOpen(this.round()!.state),
  );
  /** Offer the DLS defaults in one click while the round measures neither of them. */
  protected readonly lacksDlsDefaults = computed(() => {
    const keys = new Set(this.round()?.measurands.map((m) => m.key));
    return DLS_DEFAULT_MEASURANDS.every((m) => !keys.has(m.key));
  });

  protected readonly nextStates = computed(() => {
    const r = this.round();
    return r ? ROUND_TRANSITIONS[r.state].filter((s) => isDeskMove(r.state, s)) : [];
  });
  protected readonly moveOf = describeMove;
  protected readonly receiptSummary = computed(() => {
    const active = this.enrolments().filter((e) => e.state === 'enrolled');
    const count = (s: ReceiptStatus) => active.filter((e) => e.receiptStatus === s).length;
    return (
      `${active.length} enrolled: ${count('not-dispatched')} not dispatched, ${count('dispatched')} in transit, ` +
      `${count('received')} received intact, ${count('received-with-problem')} received with a problem.`
    );
  });

  protected readonly inviteForm = this.fb.group({ invitations: this.fb.array([this.inviteRow()]) });
  protected readonly studyForm = this.fb.group({
    kind: ['homogeneity' as 'homogeneity' | 'stability'],
    testItemId: [''],
    measurandId: [''],
    sigmaPt: [null as number | null],
    text: [''],
  });

  private readonly itemActions: RowAction<TestItem>[] = [
    { label: 'Edit', ariaLabel: (i) => `Edit item ${i.code}`, run: (i) => this.editItem(i) },
    { label: 'Remove', ariaLabel: (i) => `Remove item ${i.code}`, run: (i) => this.removeItem(i) },
  ];
  protected readonly itemColumns = computed<ColDef<TestItem>[]>(() => [
    { field: 'code', headerName: 'Item', width: 90 },
    { field: 'material', headerName: 'Material', flex: 1, minWidth: 180 },
    { field: 'nominalSizeNm', headerName: 'Nominal size (nm)', width: 160, type: 'rightAligned' },
    { field: 'storageNotes', headerName: 'Storage', flex: 1 },
    { field: 'handlingNotes', headerName: 'Handling', flex: 1 },
    ...(this.designOpen()
      ? [
          {
            colId: 'actions',
            headerName: '',
            width: 180,
            sortable: false,
            cellRenderer: ActionCell,
            cellRendererParams: { actions: this.itemActions },
          },
        ]
      : []),
  ]);
  private readonly measurandActions: RowAction<Measurand>[] = [
    {
      label: 'Edit',
      ariaLabel: (m) => `Edit measurand ${m.name}`,
      run: (m) => this.editMeasurand(m),
    },
    {
      label: 'Remove',
      ariaLabel: (m) => `Remove measurand ${m.name}`,
      run: (m) => this.removeMeasurand(m),
    },
  ];
  protected readonly measurandColumns = computed<ColDef<Measurand>[]>(() => [
    { field: 'name', headerName: 'Measurand', flex: 1, minWidth: 180 },
    { field: 'key', headerName: 'File code', width: 110 },
    {
      field: 'unit',
      headerName: 'Unit',
      width: 80,
      valueFormatter: ({ value }) => (value as string) || '–',
    },
    { field: 'decimals', headerName: 'Decimals', width: 100, type: 'rightAligned' },
    { field: 'replicatesRequired', headerName: 'Replicates', width: 110, type: 'rightAligned' },
    {
      colId: 'sigma',
      headerName: 'σ_pt rule',
      width: 170,
      valueGetter: ({ data }) => (data ? sigmaRuleText(data.sigmaPtRule, data.unit) : ''),
    },
    {
      colId: 'xpt',
      headerName: 'Assigned value',
      flex: 1,
      minWidth: 170,
      valueGetter: ({ data }) => (data ? assignedRuleText(data.assignedValueRule, data.unit) : ''),
    },
    { field: 'minParticipants', headerName: 'Min. participants', width: 150, type: 'rightAligned' },
    ...(this.designOpen()
      ? [
          {
            colId: 'actions',
            headerName: '',
            width: 180,
            sortable: false,
            cellRenderer: ActionCell,
            cellRendererParams: { actions: this.measurandActions },
          },
        ]
      : []),
  ]);
  protected readonly invitationColumns: ColDef<Invitation>[] = [
    { field: 'email', headerName: 'E-mail', flex: 1, minWidth: 200 },
    {
      colId: 'lab',
      headerName: 'Lab',
      flex: 1,
      valueGetter: ({ data }) =>
        data?.organisationName ?? (data?.labName ? `${data.labName} (new)` : ''),
    },
    {
      field: 'createdAt',
      headerName: 'Sent',
      width: 170,
      valueFormatter: ({ value }) => formatDate(value as string, true),
    },
    {
      field: 'expiresAt',
      headerName: 'Expires',
      width: 170,
      valueFormatter: ({ value }) => formatDate(value as string, true),
    },
    {
      field: 'acceptedAt',
      headerName: 'Accepted',
      width: 170,
      valueFormatter: ({ value }) => formatDate(value as string | null, true),
    },
  ];
  private readonly enrolmentActions: RowAction<Enrolment>[] = [
    {
      label: 'Dispatch',
      ariaLabel: (e) => `Record dispatch to ${e.participantCode}`,
      run: (e) => this.dispatch(e),
    },
    {
      label: 'Extend',
      ariaLabel: (e) => `Grant ${e.participantCode} an extension`,
      run: (e) => this.extend(e),
    },
    {
      label: 'Withdraw',
      ariaLabel: (e) => `Withdraw ${e.participantCode}`,
      run: (e) => this.withdraw(e),
    },
  ];
  protected readonly enrolmentColumns: ColDef<Enrolment>[] = [
    { field: 'participantCode', headerName: 'Participant code', width: 150 },
    { field: 'organisationName', headerName: 'Lab', flex: 1, minWidth: 160 },
    {
      field: 'state',
      headerName: 'State',
      width: 110,
      valueFormatter: ({ data }) =>
        data?.state === 'withdrawn' ? `Withdrawn: ${data.withdrawnReason}` : 'Enrolled',
    },
    {
      field: 'receiptStatus',
      headerName: 'Receipt',
      width: 210,
      valueFormatter: ({ value }) => RECEIPT_LABELS[value as ReceiptStatus],
    },
    {
      colId: 'courier',
      headerName: 'Courier / tracking',
      width: 180,
      valueGetter: ({ data }) =>
        data?.shipment
          ? `${data.shipment.courier ?? ''} ${data.shipment.trackingNumber ?? ''}`
          : '',
    },
    {
      colId: 'dispatched',
      headerName: 'Dispatched',
      width: 120,
      valueGetter: ({ data }) => formatDate(data?.shipment?.dispatchedOn),
    },
    {
      colId: 'received',
      headerName: 'Received',
      width: 120,
      valueGetter: ({ data }) => formatDate(data?.shipment?.receivedOn),
    },
    {
      colId: 'condition',
      headerName: 'Condition',
      width: 160,
      valueGetter: ({ data }) => conditionLabel(data?.shipment?.condition),
    },
    {
      field: 'extensionUntil',
      headerName: 'Extension until',
      width: 170,
      valueFormatter: ({ value }) => (value ? formatDate(value as string, true) : ''),
    },
    {
      field: 'submitted',
      headerName: 'Submitted',
      width: 100,
      valueFormatter: ({ value }) => (value ? 'Yes' : 'No'),
    },
    {
      colId: 'actions',
      headerName: 'Actions',
      pinned: 'right',
      width: 260,
      sortable: false,
      cellRenderer: ActionCell,
      cellRendererParams: { actions: this.enrolmentActions },
    },
  ];
  private readonly studyActions: RowAction<Study>[] = [
    {
      label: 'Decide',
      ariaLabel: (s) =>
        `Record a decision on the ${STUDY_KIND_LABELS[s.kind].toLowerCase()} of ${s.testItemCode}`,
      run: (s) => this.decide(s),
    },
  ];
  protected readonly studyColumns: ColDef<Study>[] = [
    {
      field: 'kind',
      headerName: 'Study',
      width: 160,
      valueFormatter: ({ value }) => STUDY_KIND_LABELS[value as Study['kind']],
    },
    { field: 'testItemCode', headerName: 'Item', width: 80 },
    { field: 'measurandName', headerName: 'Measurand', width: 170 },
    {
      field: 'sigmaPt',
      headerName: 'σ_pt',
      width: 100,
      type: 'rightAligned',
      valueFormatter: ({ value }) => (value as number).toPrecision(4),
    },
    {
      colId: 'numbers',
      headerName: 'Numbers (unit of the measurand)',
      flex: 1,
      minWidth: 320,
      autoHeight: true,
      wrapText: true,
      valueGetter: ({ data }) => (data ? studyNumbers(data) : ''),
    },
    {
      field: 'passes',
      headerName: 'Result',
      width: 110,
      valueFormatter: ({ value }) => (value ? 'Pass' : 'Fail'),
      cellClass: ({ value }) => (value ? 'pass' : 'fail'),
    },
    {
      colId: 'decision',
      headerName: 'Decision',
      width: 220,
      valueGetter: ({ data }) =>
        data?.passes
          ? '—'
          : data?.decision
            ? `${HOMOGENEITY_DECISION_LABELS[data.decision as HomogeneityDecisionKind] ?? data.decision}: ${data.decisionReason}`
            : 'Needed before publication',
    },
    {
      colId: 'actions',
      headerName: '',
      width: 110,
      sortable: false,
      cellRenderer: ActionCell,
      cellRendererParams: { actions: this.studyActions },
    },
  ];

  ngOnInit(): void {
    this.reload();
    this.api.labs().subscribe((l) => this.labs.set(l));
  }

  private reload(): void {
    const id = this.id();
    this.api.round(id).subscribe((r) => {
      this.round.set(r);
      if (!this.studyForm.controls.testItemId.value && r.items[0])
        this.studyForm.controls.testItemId.setValue(r.items[0].id);
      if (!this.studyForm.controls.measurandId.value && r.measurands[0])
        this.studyForm.controls.measurandId.setValue(r.measurands[0].id);
    });
    this.api.invitations(id).subscribe((i) => this.invitations.set(i));
    this.api.enrolments(id).subscribe((e) => this.enrolments.set(e));
    this.api.studies(id).subscribe((s) => this.studies.set(s));
  }

  private open<T>(data: DeskDialogData<T>, after: (value: T) => void): void {
    this.dialog
      .open(DeskDialog<T>, { data, width: '480px', maxWidth: '95vw' })
      .afterClosed()
      .subscribe((v?: T) => {
        if (v) after(v);
      });
  }

  protected move(to: RoundState): void {
    const r = this.round()!;
    const closingEarly =
      to === 'closed' && (!r.resultsDueAt || new Date(r.resultsDueAt).getTime() > Date.now());
    const move = describeMove(r.state, to);
    this.open(
      {
        kind: 'transition',
        title: move.backwards
          ? `${move.label}: ${r.code}`
          : `Move ${r.code} to ${ROUND_STATE_LABELS[to]}`,
        moveLabel: move.label,
        whoIsTold: move.whoIsTold,
        intro: closingEarly
          ? 'Results are not due yet: tick "Close early" and give a reason.'
          : undefined,
        to,
        offerForce: closingEarly,
        reasonRequired: closingEarly || move.backwards,
        send: (v: never) => this.api.transition(r.id, v),
      },
      (updated: RoundDetailDto) => {
        this.round.set(updated);
        this.reload();
      },
    );
  }

  protected editRound(): void {
    const r = this.round();
    if (!r) return;
    this.dialog
      .open(RoundEditDialog, { data: r, width: '720px', maxWidth: '95vw' })
      .afterClosed()
      .subscribe((updated?: RoundDetailDto) => {
        if (updated) this.round.set(updated);
      });
  }

  /** Add a test item (no argument) or edit one. */
  protected editItem(item?: TestItem): void {
    const data: ItemDialogData = { roundId: this.id(), item };
    this.dialog
      .open(ItemDialog, { data, width: '560px', maxWidth: '95vw' })
      .afterClosed()
      .subscribe((saved?: true) => {
        if (saved) this.reload();
      });
  }

  private removeItem(item: TestItem): void {
    this.open(
      {
        kind: 'confirm',
        title: `Remove test item ${item.code}?`,
        intro: `${item.code} · ${item.material}`,
        confirmLabel: `Remove item ${item.code}`,
        send: () => this.api.deleteItem(this.id(), item.id),
      },
      () => this.reload(),
    );
  }

  /** Add a measurand (no argument) or edit one with its σ_pt and assigned-value rules. */
  protected editMeasurand(measurand?: Measurand): void {
    const data: MeasurandDialogData = { roundId: this.id(), measurand };
    this.dialog
      .open(MeasurandDialog, { data, width: '720px', maxWidth: '95vw' })
      .afterClosed()
      .subscribe((saved?: true) => {
        if (saved) this.reload();
      });
  }

  private removeMeasurand(m: Measurand): void {
    this.open(
      {
        kind: 'confirm',
        title: `Remove measurand ${m.name}?`,
        confirmLabel: `Remove ${m.name}`,
        send: () => this.api.deleteMeasurand(this.id(), m.id),
      },
      () => this.reload(),
    );
  }

  protected addDlsDefaults(): void {
    this.message.set(null);
    this.busy.set(true);
    this.api.addMeasurands(this.id(), [...DLS_DEFAULT_MEASURANDS]).subscribe({
      next: () => {
        this.busy.set(false);
        this.reload();
      },
      error: (e: unknown) => {
        this.busy.set(false);
        this.message.set(problemMessage(e));
      },
    });
  }

  private inviteRow() {
    return this.fb.group({ organisationId: [''], labName: [''], email: [''] });
  }
  protected addInvite(): void {
    this.inviteForm.controls.invitations.push(this.inviteRow());
  }
  protected removeInvite(i: number): void {
    if (this.inviteForm.controls.invitations.length > 1)
      this.inviteForm.controls.invitations.removeAt(i);
  }

  protected invite(): void {
    const rows = this.inviteForm.getRawValue().invitations.map((row) => ({
      organisationId: row.organisationId || null,
      email: row.email,
      labName: row.organisationId ? null : row.labName.trim() || null,
    }));
    const value = parseWith(
      this.inviteForm,
      InvitationsCreate,
      { invitations: rows },
      this.inviteFailure,
    );
    if (!value) return;
    this.busy.set(true);
    this.api.invite(this.id(), value.invitations).subscribe({
      next: () => {
        this.busy.set(false);
        this.inviteForm.controls.invitations.clear();
        this.addInvite();
        this.reload();
      },
      error: (e: unknown) => {
        this.busy.set(false);
        showServerError(this.inviteForm, e, this.inviteFailure);
      },
    });
  }

  private replaceEnrolment = (e: Enrolment) =>
    this.enrolments.update((list) => list.map((x) => (x.id === e.id ? e : x)));

  private dispatch(e: Enrolment): void {
    this.open(
      {
        kind: 'dispatch',
        title: `Dispatch to ${e.participantCode}`,
        intro: 'The lab is e-mailed the courier and tracking number, with the handling cautions.',
        cautions: DISPATCH_CAUTIONS,
        send: (v: never) => this.api.dispatch(this.id(), e.id, v),
      },
      this.replaceEnrolment,
    );
  }
  private extend(e: Enrolment): void {
    this.open(
      {
        kind: 'extension',
        title: `Extension for ${e.participantCode}`,
        send: (v: never) => this.api.extend(this.id(), e.id, v),
      },
      this.replaceEnrolment,
    );
  }
  private withdraw(e: Enrolment): void {
    this.open(
      {
        kind: 'withdrawal',
        title: `Withdraw ${e.participantCode} (${e.organisationName})`,
        send: (v: never) => this.api.withdraw(this.id(), e.id, v),
      },
      this.replaceEnrolment,
    );
  }
  private decide(s: Study): void {
    if (s.passes) return;
    this.open(
      {
        kind: 'decision',
        title: `Decision on the ${STUDY_KIND_LABELS[s.kind].toLowerCase()} of item ${s.testItemCode}`,
        intro: studyNumbers(s),
        send: (v: never) => this.api.decide(this.id(), s.id, v),
      },
      () => this.reload(),
    );
  }

  private studyTarget() {
    const v = this.studyForm.getRawValue();
    return {
      kind: v.kind,
      testItemId: v.testItemId,
      measurandId: v.measurandId,
      sigmaPt: v.sigmaPt === null || (v.sigmaPt as unknown) === '' ? null : Number(v.sigmaPt),
    };
  }

  protected recordStudy(): void {
    const target = this.studyTarget();
    const lines = parseReplicateText(this.studyForm.controls.text.value);
    const data =
      target.kind === 'homogeneity'
        ? { items: lines }
        : { first: lines[0] ?? [], second: lines[1] ?? [] };
    const value = parseWith(this.studyForm, StudyInput, { ...target, data }, this.studyFailure);
    if (!value) return;
    this.sendStudy(this.api.recordStudy(this.id(), value));
  }

  protected upload(file: File): void {
    const t = this.studyTarget();
    const form = new FormData();
    form.append('kind', t.kind);
    form.append('testItemId', t.testItemId);
    form.append('measurandId', t.measurandId);
    if (t.sigmaPt !== null) form.append('sigmaPt', String(t.sigmaPt));
    form.append('file', file);
    this.sendStudy(this.api.uploadStudy(this.id(), form));
  }

  private sendStudy(call: Observable<Study>): void {
    this.studyFailure.set(null);
    this.busy.set(true);
    call.subscribe({
      next: () => {
        this.busy.set(false);
        this.reload();
      },
      error: (e: unknown) => {
        this.busy.set(false);
        showServerError(this.studyForm, e, this.studyFailure);
      },
    });
  }
}
