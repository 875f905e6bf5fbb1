import { signal } from '@angular/core';
import { HttpErrorResponse } from '@angular/common/http';
import type { Observable } from 'rxjs';

export type SaveState = 'idle' | 'saving' | 'saved' | 'offline' | 'conflict' | 'locked' | 'error';

export const SAVE_STATE_LABELS: Record<SaveState, string> = {
  idle: 'No changes yet',
  saving: 'Saving…',
  saved: 'Saved',
  offline: 'Offline — will retry',
  conflict: 'Changed elsewhere — reload to continue',
  locked: 'Locked — results can no longer change',
  error: 'Not saved — will retry',
};

/**
 * Saves a draft as the lab types: debounced, one request at a time, retrying with back-off while the
 * connection is down, and keeping the latest unsaved copy in local storage so a reload loses nothing.
 */
export class DraftAutosave<T> {
  readonly state = signal<SaveState>('idle');
  readonly revision = signal(0);
  readonly savedAt = signal<string | null>(null);
  private pending: T | null = null;
  private inFlight = false;
  private timer: ReturnType<typeof setTimeout> | null = null;
  private retryMs = 0;

  constructor(
    private readonly save: (
      data: T,
      baseRevision: number,
    ) => Observable<{ draftRevision: number; savedAt: string }>,
    private readonly storageKey: string,
    private readonly debounceMs = 700,
  ) {}

  /** Starts from the server's revision; returns a local unsaved copy made on top of it, if any. */
  start(revision: number): T | null {
    this.revision.set(revision);
    try {
      const raw = localStorage.getItem(this.storageKey);
      if (!raw) return null;
      const stored = JSON.parse(raw) as { base: number; data: T };
      if (stored.base === revision) return stored.data;
      localStorage.removeItem(this.storageKey);
    } catch {
      /* storage unavailable: the server copy is the record */
    }
    return null;
  }

  /** Queues a save of the latest data. */
  changed(data: T): void {
    if (this.state() === 'locked' || this.state() === 'conflict') return;
    this.pending = data;
    try {
      localStorage.setItem(this.storageKey, JSON.stringify({ base: this.revision(), data }));
    } catch {
      /* ignore */
    }
    this.schedule(this.debounceMs);
  }

  /** Saves now (e.g. the Retry button, or the browser coming back online). */
  retry(): void {
    if (this.pending) this.schedule(0);
  }

  get hasPending(): boolean {
    return this.pending !== null || this.inFlight;
  }

  stop(): void {
    if (this.timer) clearTimeout(this.timer);
  }

  private schedule(ms: number): void {
    if (this.timer) clearTimeout(this.timer);
    this.timer = setTimeout(() => this.flush(), ms);
  }

  private flush(): void {
    if (this.inFlight || !this.pending) return;
    const data = this.pending;
    this.pending = null;
    this.inFlight = true;
    this.state.set('saving');
    this.save(data, this.revision()).subscribe({
      next: (res) => {
        this.inFlight = false;
        this.retryMs = 0;
        this.revision.set(res.draftRevision);
        this.savedAt.set(res.savedAt);
        if (this.pending) {
          this.schedule(0);
        } else {
          this.state.set('saved');
          try {
            localStorage.removeItem(this.storageKey);
          } catch {
            /* ignore */
          }
        }
      },
      error: (err: unknown) => {
        this.inFlight = false;
        this.pending ??= data;
        const status = err instanceof HttpErrorResponse ? err.status : 0;
        const code =
          err instanceof HttpErrorResponse
            ? (err.error as { error?: { code?: string } } | null)?.error?.code
            : undefined;
        if (status === 409 && code === 'submission_locked') return this.state.set('locked');
        if (status === 409) return this.state.set('conflict');
        this.state.set(status === 0 ? 'offline' : 'error');
        this.retryMs = Math.min(30_000, this.retryMs ? this.retryMs * 2 : 2_000);
        this.schedule(this.retryMs);
      },
    });
  }
}
