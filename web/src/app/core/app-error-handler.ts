import { type ErrorHandler, Injectable, inject } from '@angular/core';
import { HttpErrorResponse } from '@angular/common/http';
import { MatSnackBar } from '@angular/material/snack-bar';

/**
 * The app's one ErrorHandler: logs unexpected errors and tells the user calmly. HTTP errors are
 * already shown by the error interceptor, so they are only logged here.
 */
@Injectable()
export class AppErrorHandler implements ErrorHandler {
  private readonly snackBar = inject(MatSnackBar);

  handleError(error: unknown): void {
    console.error(error);
    if (error instanceof HttpErrorResponse) return;
    this.snackBar.open('Something went wrong on this page. Reload it if it misbehaves.', 'Close', {
      duration: 8000,
    });
  }
}
