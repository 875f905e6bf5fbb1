import { HttpClient, HttpContext } from '@angular/common/http';
import { Injectable, computed, inject, signal } from '@angular/core';
import { firstValueFrom } from 'rxjs';
import type { HealthResponse } from '@ringlet/shared/contracts/common';
import { API, HANDLED_STATUSES } from './api';
import { loadContracts } from './contracts';

type Mode = HealthResponse['mode'];

/** Which mode the server runs in (the Outbox exists only in demo and development). */
@Injectable({ providedIn: 'root' })
export class HealthService {
  private readonly http = inject(HttpClient);
  private readonly currentMode = signal<Mode | null>(null);
  private loading: Promise<Mode | null> | null = null;

  readonly mode = this.currentMode.asReadonly();
  readonly hasOutbox = computed(() => isMailViewerMode(this.currentMode()));

  /** GET /health once per page load; null when the server cannot say. */
  ensureLoaded(): Promise<Mode | null> {
    this.loading ??= firstValueFrom(
      this.http.get<unknown>(`${API}/health`, {
        context: new HttpContext().set(HANDLED_STATUSES, [0, 500, 502, 503, 504]),
      }),
    ).then(
      async (body) => {
        const mode = (await loadContracts()).HealthResponse.parse(body).mode;
        this.currentMode.set(mode);
        return mode;
      },
      () => {
        this.loading = null;
        return null;
      },
    );
    return this.loading;
  }
}

/** The captured-mail viewer is only there in demo and development mode. */
export function isMailViewerMode(mode: Mode | null): boolean {
  return mode === 'demo' || mode === 'development';
}
