import {
  HttpClient,
  HttpContext,
  HttpEventType,
  HttpParams,
  type HttpResponse,
} from '@angular/common/http';
import { Injectable, computed, inject } from '@angular/core';
import { type Observable, filter, map, tap } from 'rxjs';
import * as z from 'zod';
import {
  AttachmentDto,
  DraftSaved,
  InstrumentCheck,
  type InstrumentCheckInput,
  MyRound,
  MyRoundDetail,
  type ReceiptInput,
  SubmissionView,
  SubmitResult,
  WorkbookUploadResult,
} from '@ringlet/shared/contracts/bench';
import type { SubmissionData } from '@ringlet/shared/contracts/submission';
import { API, HANDLED_STATUSES } from '../core/api';
import { AuthService } from '../core/auth-service';

/** Calls whose errors the page shows itself (field errors, rule breaks, conflicts, offline). */
const handled = (...statuses: number[]) => ({
  context: new HttpContext().set(HANDLED_STATUSES, statuses),
});

/** The Lab bench calls. Every response is parsed with the shared contract. */
@Injectable({ providedIn: 'root' })
export class BenchService {
  private readonly http = inject(HttpClient);
  private readonly auth = inject(AuthService);

  /**
   * The labs the user belongs to, and the one the bench acts for: the lab chosen in the session
   * (the header's lab chooser), or the only lab; null until a person in several labs chooses.
   */
  readonly labs = computed(() => this.auth.me()?.memberships ?? []);
  readonly labId = this.auth.actingLabId;

  private params(): HttpParams {
    const id = this.labId();
    return id ? new HttpParams().set('labId', id) : new HttpParams();
  }

  myRounds(): Observable<MyRound[]> {
    return this.http
      .get<unknown>(`${API}/my/rounds`, { params: this.params() })
      .pipe(map((b) => z.array(MyRound).parse(b)));
  }

  round(id: string): Observable<MyRoundDetail> {
    return this.http
      .get<unknown>(`${API}/my/rounds/${id}`, { params: this.params() })
      .pipe(map((b) => MyRoundDetail.parse(b)));
  }

  saveReceipt(id: string, input: ReceiptInput, photo: File | null): Observable<MyRoundDetail> {
    const form = new FormData();
    form.set('receivedOn', input.receivedOn);
    form.set('condition', input.condition);
    form.set('notes', input.notes);
    if (photo) form.set('photo', photo);
    return this.http
      .put<unknown>(`${API}/rounds/${id}/receipt`, form, {
        params: this.params(),
        ...handled(400, 409, 413, 415, 422),
      })
      .pipe(map((b) => MyRoundDetail.parse(b)));
  }

  instrumentChecks(): Observable<InstrumentCheck[]> {
    return this.http
      .get<unknown>(`${API}/my/instrument-checks`, { params: this.params() })
      .pipe(map((b) => z.array(InstrumentCheck).parse(b)));
  }

  recordCheck(input: InstrumentCheckInput): Observable<InstrumentCheck> {
    return this.http
      .post<unknown>(`${API}/my/instrument-checks`, input, {
        params: this.params(),
        ...handled(400, 422),
      })
      .pipe(map((b) => InstrumentCheck.parse(b)));
  }

  submission(id: string): Observable<SubmissionView> {
    return this.http
      .get<unknown>(`${API}/rounds/${id}/submission`, { params: this.params() })
      .pipe(map((b) => SubmissionView.parse(b)));
  }

  /** Autosave: the caller handles offline (0), conflicts (409) and server errors itself. */
  saveDraft(id: string, data: SubmissionData, baseRevision: number): Observable<DraftSaved> {
    return this.http
      .put<unknown>(
        `${API}/rounds/${id}/submission`,
        { data, baseRevision },
        { params: this.params(), ...handled(0, 400, 409, 500, 502, 503, 504) },
      )
      .pipe(map((b) => DraftSaved.parse(b)));
  }

  submit(
    id: string,
    idempotencyKey: string,
    data: SubmissionData,
    note: string | undefined,
  ): Observable<SubmitResult> {
    return this.http
      .post<unknown>(
        `${API}/rounds/${id}/submission/submit`,
        { idempotencyKey, data, note },
        { params: this.params(), ...handled(0, 400, 409, 422) },
      )
      .pipe(map((b) => SubmitResult.parse(b)));
  }

  attachments(id: string): Observable<AttachmentDto[]> {
    return this.http
      .get<unknown>(`${API}/rounds/${id}/submission/attachments`, { params: this.params() })
      .pipe(map((b) => z.array(AttachmentDto).parse(b)));
  }

  /**
   * Uploads a raw-data file; `optics` are this file's laser wavelength and scattering angle for the
   * re-analysis (empty: the item's conditions, else the stated defaults). `progress` hears 0–100.
   */
  upload(
    id: string,
    file: File,
    testItemId: string | null,
    optics: { laserWavelengthNm?: number | null; scatteringAngleDeg?: number | null } = {},
    progress?: (percent: number) => void,
  ): Observable<AttachmentDto> {
    const form = new FormData();
    form.set('file', file);
    if (testItemId) form.set('testItemId', testItemId);
    if (optics.laserWavelengthNm != null)
      form.set('laserWavelengthNm', String(optics.laserWavelengthNm));
    if (optics.scatteringAngleDeg != null)
      form.set('scatteringAngleDeg', String(optics.scatteringAngleDeg));
    return this.http
      .post<unknown>(`${API}/rounds/${id}/submission/attachments`, form, {
        params: this.params(),
        ...handled(400, 409, 413, 415),
        reportProgress: true,
        observe: 'events',
      })
      .pipe(
        tap((e) => {
          if (e.type === HttpEventType.UploadProgress && e.total)
            progress?.(Math.round((100 * e.loaded) / e.total));
        }),
        filter((e): e is HttpResponse<unknown> => e.type === HttpEventType.Response),
        map((e) => AttachmentDto.parse(e.body)),
      );
  }

  uploadWorkbook(id: string, file: File): Observable<WorkbookUploadResult> {
    const form = new FormData();
    form.set('file', file);
    return this.http
      .post<unknown>(`${API}/rounds/${id}/submission/upload.xlsx`, form, {
        params: this.params(),
        ...handled(400, 409, 413, 415, 422),
      })
      .pipe(map((b) => WorkbookUploadResult.parse(b)));
  }

  /** Links for plain downloads (the session cookie goes along). */
  attachmentUrl(roundId: string, attachmentId: string): string {
    return `${API}/rounds/${roundId}/submission/attachments/${attachmentId}?${this.params().toString()}`;
  }
  templateUrl(roundId: string): string {
    return `${API}/rounds/${roundId}/submission/template.xlsx?${this.params().toString()}`;
  }
}
