import { HttpClient, HttpContext } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import { type Observable, map } from 'rxjs';
import * as z from 'zod';
import {
  AssessorGrantDto,
  BoardData,
  BoardListEntry,
  EvaluationView,
  InvestigationDto,
  LabScores,
  PublishResponse,
  TrackRecord,
  type AssessorGrantCreate,
  type EvaluationSettings,
  type InvestigationUpdate,
} from '@ringlet/shared/contracts/evaluation';
import { API, HANDLED_STATUSES } from '../core/api';

const quiet404 = { context: new HttpContext().set(HANDLED_STATUSES, [404]) };
const formCall = { context: new HttpContext().set(HANDLED_STATUSES, [400, 422]) };

/** Evaluation, Consensus board, scores, Track record, investigations and grants. Responses parsed here. */
@Injectable({ providedIn: 'root' })
export class BoardService {
  private readonly http = inject(HttpClient);

  boards(): Observable<BoardListEntry[]> {
    return this.http
      .get<unknown>(`${API}/boards`)
      .pipe(map((b) => z.array(BoardListEntry).parse(b)));
  }

  board(roundId: string, revealNames = false): Observable<BoardData> {
    const q = revealNames ? '?reveal=names' : '';
    return this.http
      .get<unknown>(`${API}/rounds/${roundId}/board${q}`, quiet404)
      .pipe(map((b) => BoardData.parse(b)));
  }

  evaluation(roundId: string): Observable<EvaluationView> {
    return this.http
      .get<unknown>(`${API}/rounds/${roundId}/evaluation`, quiet404)
      .pipe(map((b) => EvaluationView.parse(b)));
  }

  evaluate(roundId: string, settings: Partial<EvaluationSettings>): Observable<EvaluationView> {
    return this.http
      .post<unknown>(`${API}/rounds/${roundId}/evaluation`, settings, formCall)
      .pipe(map((b) => EvaluationView.parse(b)));
  }

  commit(roundId: string): Observable<EvaluationView> {
    return this.http
      .post<unknown>(`${API}/rounds/${roundId}/evaluation/commit`, {})
      .pipe(map((b) => EvaluationView.parse(b)));
  }

  publish(roundId: string): Observable<z.infer<typeof PublishResponse>> {
    return this.http
      .post<unknown>(`${API}/rounds/${roundId}/publish`, {})
      .pipe(map((b) => PublishResponse.parse(b)));
  }

  reissue(
    roundId: string,
    reason: string,
    settings: Partial<EvaluationSettings>,
  ): Observable<EvaluationView> {
    return this.http
      .post<unknown>(`${API}/rounds/${roundId}/reissue`, { reason, settings }, formCall)
      .pipe(map((b) => EvaluationView.parse(b)));
  }

  myScores(roundId: string): Observable<LabScores> {
    return this.http
      .get<unknown>(`${API}/my/rounds/${roundId}/scores`, quiet404)
      .pipe(map((b) => LabScores.parse(b)));
  }

  trackRecord(): Observable<TrackRecord> {
    return this.http.get<unknown>(`${API}/my/track-record`).pipe(map((b) => TrackRecord.parse(b)));
  }

  myInvestigations(): Observable<InvestigationDto[]> {
    return this.http
      .get<unknown>(`${API}/my/investigations`)
      .pipe(map((b) => z.array(InvestigationDto).parse(b)));
  }

  investigations(): Observable<InvestigationDto[]> {
    return this.http
      .get<unknown>(`${API}/investigations`)
      .pipe(map((b) => z.array(InvestigationDto).parse(b)));
  }

  investigation(id: string): Observable<InvestigationDto> {
    return this.http
      .get<unknown>(`${API}/investigations/${id}`, quiet404)
      .pipe(map((b) => InvestigationDto.parse(b)));
  }

  updateInvestigation(id: string, patch: InvestigationUpdate): Observable<InvestigationDto> {
    return this.http
      .patch<unknown>(`${API}/investigations/${id}`, patch, formCall)
      .pipe(map((b) => InvestigationDto.parse(b)));
  }

  closeInvestigation(id: string): Observable<InvestigationDto> {
    return this.http
      .post<unknown>(`${API}/investigations/${id}/close`, {}, formCall)
      .pipe(map((b) => InvestigationDto.parse(b)));
  }

  grants(labId: string): Observable<AssessorGrantDto[]> {
    return this.http
      .get<unknown>(`${API}/labs/${labId}/assessor-grants`)
      .pipe(map((b) => z.array(AssessorGrantDto).parse(b)));
  }

  grant(labId: string, body: AssessorGrantCreate): Observable<AssessorGrantDto> {
    return this.http
      .post<unknown>(`${API}/labs/${labId}/assessor-grants`, body, formCall)
      .pipe(map((b) => AssessorGrantDto.parse(b)));
  }

  revokeGrant(labId: string, grantId: string): Observable<void> {
    return this.http
      .delete(`${API}/labs/${labId}/assessor-grants/${grantId}`)
      .pipe(map(() => undefined));
  }
}
