import { ReactiveFormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatDialogModule } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';

/**
 * What a small form dialog imports: a reactive form of Material inputs between a dialog title,
 * content and Cancel / confirm actions. `imports: [...FORM_DIALOG_IMPORTS]` (add what else the
 * dialog uses, e.g. MatSelectModule).
 */
export const FORM_DIALOG_IMPORTS = [
  ReactiveFormsModule,
  MatDialogModule,
  MatButtonModule,
  MatFormFieldModule,
  MatInputModule,
] as const;
