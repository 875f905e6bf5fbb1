import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import { type Observable, map } from 'rxjs';
import * as z from 'zod';
import { OutboxMessage } from '@ringlet/shared/contracts/admin';
import { API } from '../core/api';

/** Mail the server captured instead of sending (demo and development mode only). */
@Injectable({ providedIn: 'root' })
export class OutboxService {
  private readonly http = inject(HttpClient);

  /** Newest first. */
  messages(): Observable<OutboxMessage[]> {
    return this.http
      .get<unknown>(`${API}/dev/outbox`)
      .pipe(map((body) => z.array(OutboxMessage).parse(body)));
  }
}
