import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import { type Observable, map } from 'rxjs';
import * as z from 'zod';
import {
  ProviderProfile,
  RoundComments,
  type ProviderProfileInput,
} from '@ringlet/shared/contracts/provider';
import { API } from '../core/api';

const CommentsAnswer = RoundComments.extend({ editable: z.boolean() });
export type CommentsAnswer = z.infer<typeof CommentsAnswer>;

/** The PT provider's profile (printed on every report, certificate and e-mail) and a round's comments. */
@Injectable({ providedIn: 'root' })
export class ProviderService {
  private readonly http = inject(HttpClient);

  profile(): Observable<ProviderProfile> {
    return this.http.get<unknown>(`${API}/provider`).pipe(map((b) => ProviderProfile.parse(b)));
  }

  save(input: ProviderProfileInput): Observable<ProviderProfile> {
    return this.http
      .put<unknown>(`${API}/provider`, input)
      .pipe(map((b) => ProviderProfile.parse(b)));
  }

  setLogo(dataBase64: string): Observable<ProviderProfile> {
    return this.http
      .put<unknown>(`${API}/provider/logo`, { dataBase64 })
      .pipe(map((b) => ProviderProfile.parse(b)));
  }

  removeLogo(): Observable<ProviderProfile> {
    return this.http
      .delete<unknown>(`${API}/provider/logo`)
      .pipe(map((b) => ProviderProfile.parse(b)));
  }

  comments(roundId: string): Observable<CommentsAnswer> {
    return this.http
      .get<unknown>(`${API}/rounds/${roundId}/evaluation/comments`)
      .pipe(map((b) => CommentsAnswer.parse(b)));
  }

  saveComments(roundId: string, comments: string): Observable<CommentsAnswer> {
    return this.http
      .put<unknown>(`${API}/rounds/${roundId}/evaluation/comments`, { comments })
      .pipe(map((b) => CommentsAnswer.parse(b)));
  }
}
