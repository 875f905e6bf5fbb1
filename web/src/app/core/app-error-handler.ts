import { type ErrorHandler, Injectable, Injector, inject } from '@angular/core';
import { HttpErrorResponse } from '@angular/common/http';
import { openSnackBar } from './snack-bar';

/**
 * The app's one ErrorHandler: logs unexpected errors and tells the user calmly. HTTP errors are
 * already shown by the error interceptor, so they are only logged here.
 */
@Injectable()
export class AppErrorHandler implements ErrorHandler {
  private readonly injector = inject(Injector);

  handleError(error: unknown): void {
    console.error(error);
    if (error instanceof HttpErrorResponse) return;
    openSnackBar(this.injector, 'Something went wrong on this page. Reload it if it misbehaves.', {
      duration: 8000,
    });
  }
}
