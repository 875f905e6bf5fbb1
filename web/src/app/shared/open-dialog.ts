import type { ComponentType } from '@angular/cdk/portal';
import type { MatDialog } from '@angular/material/dialog';

/**
 * Opens `component` with `data` (at most 95% of the viewport wide) and hands its result to
 * `after` once it closes with one; a cancelled dialog calls nothing.
 */
export function openDialog<C, D, R>(
  dialog: MatDialog,
  component: ComponentType<C>,
  data: D,
  width: string,
  after: (result: R) => void,
): void {
  dialog
    .open<C, D, R>(component, { data, width, maxWidth: '95vw' })
    .afterClosed()
    .subscribe((result) => {
      if (result) after(result);
    });
}
