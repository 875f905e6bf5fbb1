import { HttpClient, HttpContext } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import { type Observable, map } from 'rxjs';
import {
  PrecisionAnalysis,
  type PrecisionDecisionInput,
  type PrecisionReferencesBody,
  type PrecisionWithdrawBody,
} from '@ringlet/shared/contracts/precision';
import { API, HANDLED_STATUSES } from '../core/api';

/** The page shows a refused decision itself; everything else goes to the snackbar. */
const decisionCall = { context: new HttpContext().set(HANDLED_STATUSES, [400, 409, 422]) };

/** Precision study calls (ISO 5725-2). Every answer is parsed with the shared contract. */
@Injectable({ providedIn: 'root' })
export class PrecisionService {
  private readonly http = inject(HttpClient);

  analysis(roundId: string): Observable<PrecisionAnalysis> {
    return this.http
      .get<unknown>(`${API}/rounds/${roundId}/precision`)
      .pipe(map((b) => PrecisionAnalysis.parse(b)));
  }

  /** Stores decisions on flagged cells or replicates; answers the analysis with them in force. */
  decide(roundId: string, decisions: PrecisionDecisionInput[]): Observable<PrecisionAnalysis> {
    return this.http
      .post<unknown>(`${API}/rounds/${roundId}/precision/exclusions`, { decisions }, decisionCall)
      .pipe(map((b) => PrecisionAnalysis.parse(b)));
  }

  /** Withdraws a decision in force (with a reason); its flag is open again. */
  withdraw(
    roundId: string,
    exclusionId: string,
    body: PrecisionWithdrawBody,
  ): Observable<PrecisionAnalysis> {
    return this.http
      .post<unknown>(
        `${API}/rounds/${roundId}/precision/exclusions/${exclusionId}/withdraw`,
        body,
        decisionCall,
      )
      .pipe(map((b) => PrecisionAnalysis.parse(b)));
  }

  /** Replaces the levels' accepted reference values; answers the analysis with the bias. */
  references(roundId: string, body: PrecisionReferencesBody): Observable<PrecisionAnalysis> {
    return this.http
      .put<unknown>(`${API}/rounds/${roundId}/precision/references`, body, decisionCall)
      .pipe(map((b) => PrecisionAnalysis.parse(b)));
  }

  /** Finishes the study (Closed → Evaluated); 422 `undecided_flags` while a flag is open. */
  finish(roundId: string): Observable<PrecisionAnalysis> {
    return this.http
      .post<unknown>(`${API}/rounds/${roundId}/precision/finish`, {}, decisionCall)
      .pipe(map((b) => PrecisionAnalysis.parse(b)));
  }
}
