import type { Injector } from '@angular/core';
import type { MatSnackBarConfig } from '@angular/material/snack-bar';

/**
 * Shows a message in Material's snackbar, loading the snackbar (and the CDK overlay under it) on
 * first use: the shell's error handling needs it only when something goes wrong, so it stays out
 * of the script every first visit loads.
 */
export function openSnackBar(injector: Injector, message: string, config: MatSnackBarConfig): void {
  void import('@angular/material/snack-bar').then(({ MatSnackBar }) =>
    injector.get(MatSnackBar).open(message, 'Close', config),
  );
}
