import { HttpClient, HttpContext } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import { type Observable, map } from 'rxjs';
import * as z from 'zod';
import { Organisation } from '@ringlet/shared/contracts/admin';
import { PrecisionSigmaSources } from '@ringlet/shared/contracts/precision';
import {
  type DispatchInput,
  Enrolment,
  type ExtensionGrant,
  Invitation,
  InvitationAcceptResult,
  type InvitationCreate,
  InvitationInfo,
  Measurand,
  type MeasurandInput,
  type MeasurandUpdate,
  type RoundCreate,
  RoundDetail,
  RoundSummary,
  type RoundUpdate,
  Scheme,
  type SchemeCreate,
  Study,
  type StudyDecision,
  type StudyInput,
  TestItem,
  type TestItemInput,
  type TestItemUpdate,
  type TransitionRequest,
} from '@ringlet/shared/contracts/rounds';
import { API, HANDLED_STATUSES } from '../core/api';

/** Forms show their own 400/409/422 errors; everything else goes to the snackbar. */
const formCall = { context: new HttpContext().set(HANDLED_STATUSES, [400, 409, 422]) };

/** Round desk calls. Every response is parsed with the shared contract. */
@Injectable({ providedIn: 'root' })
export class RoundsService {
  private readonly http = inject(HttpClient);

  schemes(): Observable<Scheme[]> {
    return this.http.get<unknown>(`${API}/schemes`).pipe(map((b) => z.array(Scheme).parse(b)));
  }
  createScheme(body: SchemeCreate): Observable<Scheme> {
    return this.http
      .post<unknown>(`${API}/schemes`, body, formCall)
      .pipe(map((b) => Scheme.parse(b)));
  }
  rounds(): Observable<RoundSummary[]> {
    return this.http.get<unknown>(`${API}/rounds`).pipe(map((b) => z.array(RoundSummary).parse(b)));
  }
  round(id: string): Observable<RoundDetail> {
    return this.http.get<unknown>(`${API}/rounds/${id}`).pipe(map((b) => RoundDetail.parse(b)));
  }
  createRound(body: RoundCreate): Observable<RoundDetail> {
    return this.http
      .post<unknown>(`${API}/rounds`, body, formCall)
      .pipe(map((b) => RoundDetail.parse(b)));
  }
  updateRound(id: string, body: RoundUpdate): Observable<RoundDetail> {
    return this.http
      .patch<unknown>(`${API}/rounds/${id}`, body, formCall)
      .pipe(map((b) => RoundDetail.parse(b)));
  }
  transition(id: string, body: TransitionRequest): Observable<RoundDetail> {
    return this.http
      .post<unknown>(`${API}/rounds/${id}/transitions`, body, formCall)
      .pipe(map((b) => RoundDetail.parse(b)));
  }
  addItems(id: string, items: TestItemInput[]): Observable<TestItem[]> {
    return this.http
      .post<unknown>(`${API}/rounds/${id}/items`, { items }, formCall)
      .pipe(map((b) => z.array(TestItem).parse(b)));
  }
  addMeasurands(id: string, measurands: MeasurandInput[]): Observable<Measurand[]> {
    return this.http
      .post<unknown>(`${API}/rounds/${id}/measurands`, { measurands }, formCall)
      .pipe(map((b) => z.array(Measurand).parse(b)));
  }
  updateItem(id: string, itemId: string, body: TestItemUpdate): Observable<TestItem> {
    return this.http
      .patch<unknown>(`${API}/rounds/${id}/items/${itemId}`, body, formCall)
      .pipe(map((b) => TestItem.parse(b)));
  }
  /** Emits true once removed (the server answers 204). */
  deleteItem(id: string, itemId: string): Observable<true> {
    return this.http
      .delete(`${API}/rounds/${id}/items/${itemId}`, formCall)
      .pipe(map(() => true as const));
  }
  updateMeasurand(id: string, measurandId: string, body: MeasurandUpdate): Observable<Measurand> {
    return this.http
      .patch<unknown>(`${API}/rounds/${id}/measurands/${measurandId}`, body, formCall)
      .pipe(map((b) => Measurand.parse(b)));
  }
  /** Emits true once removed (the server answers 204). */
  deleteMeasurand(id: string, measurandId: string): Observable<true> {
    return this.http
      .delete(`${API}/rounds/${id}/measurands/${measurandId}`, formCall)
      .pipe(map(() => true as const));
  }
  /** The scheme's finished precision studies with s_r and s_R per level, to pick σ_pt from. */
  precisionSources(schemeId: string): Observable<PrecisionSigmaSources> {
    return this.http
      .get<unknown>(`${API}/schemes/${schemeId}/precision-sources`)
      .pipe(map((b) => PrecisionSigmaSources.parse(b)));
  }
  labs(): Observable<Organisation[]> {
    return this.http
      .get<unknown>(`${API}/lab-directory`)
      .pipe(map((b) => z.array(Organisation).parse(b)));
  }
  invitations(id: string): Observable<Invitation[]> {
    return this.http
      .get<unknown>(`${API}/rounds/${id}/invitations`)
      .pipe(map((b) => z.array(Invitation).parse(b)));
  }
  invite(id: string, invitations: InvitationCreate[]): Observable<Invitation[]> {
    return this.http
      .post<unknown>(`${API}/rounds/${id}/invitations`, { invitations }, formCall)
      .pipe(map((b) => z.array(Invitation).parse(b)));
  }
  invitationInfo(token: string): Observable<InvitationInfo> {
    return this.http
      .get<unknown>(`${API}/invitations/${token}`, {
        context: new HttpContext().set(HANDLED_STATUSES, [404]),
      })
      .pipe(map((b) => InvitationInfo.parse(b)));
  }
  acceptInvitation(token: string): Observable<InvitationAcceptResult> {
    return this.http
      .post<unknown>(
        `${API}/invitations/${token}/accept`,
        {},
        { context: new HttpContext().set(HANDLED_STATUSES, [401, 403, 404, 409]) },
      )
      .pipe(map((b) => InvitationAcceptResult.parse(b)));
  }
  enrolments(id: string): Observable<Enrolment[]> {
    return this.http
      .get<unknown>(`${API}/rounds/${id}/enrolments`)
      .pipe(map((b) => z.array(Enrolment).parse(b)));
  }
  withdraw(id: string, enrolmentId: string, reason: string): Observable<Enrolment> {
    return this.http
      .post<unknown>(
        `${API}/rounds/${id}/enrolments/${enrolmentId}/withdrawal`,
        { reason },
        formCall,
      )
      .pipe(map((b) => Enrolment.parse(b)));
  }
  extend(id: string, enrolmentId: string, body: ExtensionGrant): Observable<Enrolment> {
    return this.http
      .post<unknown>(`${API}/rounds/${id}/enrolments/${enrolmentId}/extension`, body, formCall)
      .pipe(map((b) => Enrolment.parse(b)));
  }
  dispatch(id: string, enrolmentId: string, body: DispatchInput): Observable<Enrolment> {
    return this.http
      .post<unknown>(`${API}/rounds/${id}/enrolments/${enrolmentId}/dispatch`, body, formCall)
      .pipe(map((b) => Enrolment.parse(b)));
  }
  studies(id: string): Observable<Study[]> {
    return this.http
      .get<unknown>(`${API}/rounds/${id}/homogeneity`)
      .pipe(map((b) => z.array(Study).parse(b)));
  }
  recordStudy(id: string, body: StudyInput): Observable<Study> {
    return this.http
      .post<unknown>(`${API}/rounds/${id}/homogeneity`, body, formCall)
      .pipe(map((b) => Study.parse(b)));
  }
  uploadStudy(id: string, form: FormData): Observable<Study> {
    return this.http
      .post<unknown>(`${API}/rounds/${id}/homogeneity/upload`, form, formCall)
      .pipe(map((b) => Study.parse(b)));
  }
  decide(id: string, studyId: string, body: StudyDecision): Observable<Study> {
    return this.http
      .post<unknown>(`${API}/rounds/${id}/homogeneity/${studyId}/decision`, body, formCall)
      .pipe(map((b) => Study.parse(b)));
  }
}
