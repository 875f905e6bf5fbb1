import { signal } from '@angular/core';
import type { Observable } from 'rxjs';
import { problemMessage } from '../core/problem';

/**
 * What a page reads when it opens (mostly by its route id): the value once read, and the
 * readable message when it could not be read. `load()` reads again (after a change, a toggle);
 * a value clears an earlier message. Pages that must tell a case apart (a round without scores,
 * no evaluation yet) pass `explain`; it may also act on the error and answer null to show none.
 */
export class PageLoad<T> {
  readonly value = signal<T | null>(null);
  readonly error = signal<string | null>(null);

  constructor(
    private readonly read: () => Observable<T>,
    private readonly explain: (e: unknown) => string | null = problemMessage,
  ) {}

  /** Reads the value; `then` runs with it after it is shown (to fill a form, say). */
  load(then?: (value: T) => void): void {
    this.read().subscribe({
      next: (v) => {
        this.value.set(v);
        this.error.set(null);
        then?.(v);
      },
      error: (e: unknown) => this.error.set(this.explain(e)),
    });
  }
}
