import type { AbstractControl, ValidationErrors, ValidatorFn } from '@angular/forms';
import type * as z from 'zod';
import type { FieldIssue } from '@ringlet/shared/contracts/common';

/** One problem with one field, as zod reports it (`path` is the field's path in the form). */
export interface FormIssue {
  readonly path: readonly PropertyKey[];
  readonly message: string;
}

function controlAt(
  form: AbstractControl,
  path: readonly PropertyKey[] | string,
): AbstractControl | null {
  const parts = typeof path === 'string' ? path.split('.').filter(Boolean) : path.map(String);
  return parts.length === 0 ? null : form.get(parts);
}

/**
 * A control validator from a shared zod schema: `{ zod: message }` with the schema's first message,
 * or null when the value is valid.
 */
export function zodValidator(schema: z.ZodType): ValidatorFn {
  return (control: AbstractControl): ValidationErrors | null => {
    const result = schema.safeParse(control.value);
    return result.success ? null : { zod: result.error.issues[0]?.message ?? 'Check this value.' };
  };
}

/**
 * Puts zod issues on the form controls they name (`{ zod: message }`) and marks them touched so
 * the messages show. Returns the messages that name no control (show them above the form).
 */
export function applyZodIssues(form: AbstractControl, issues: readonly FormIssue[]): string[] {
  const unplaced: string[] = [];
  for (const issue of issues) {
    const control = controlAt(form, issue.path);
    if (control && control !== form) {
      control.setErrors({ ...(control.errors ?? {}), zod: issue.message });
      control.markAsTouched();
    } else {
      unplaced.push(issue.message);
    }
  }
  return unplaced;
}

/**
 * Parses the form's raw value with a shared schema. On success returns the parsed (trimmed,
 * defaulted) value; on failure puts the issues on the controls and returns null.
 */
export function parseForm<S extends z.ZodType>(
  form: AbstractControl,
  schema: S,
): { value: z.output<S>; unplaced: [] } | { value: null; unplaced: string[] } {
  const result = schema.safeParse(form.getRawValue());
  if (result.success) return { value: result.data, unplaced: [] };
  form.markAllAsTouched();
  return { value: null, unplaced: applyZodIssues(form, result.error.issues) };
}

/**
 * Puts the server's 400 field issues (`[{ path: 'email', message }]`) under the right fields
 * (`{ server: message }`). Returns the messages that name no control.
 */
export function applyServerIssues(form: AbstractControl, issues: readonly FieldIssue[]): string[] {
  const unplaced: string[] = [];
  for (const issue of issues) {
    const control = controlAt(form, issue.path);
    if (control && control !== form) {
      control.setErrors({ ...(control.errors ?? {}), server: issue.message });
      control.markAsTouched();
    } else {
      unplaced.push(issue.message);
    }
  }
  return unplaced;
}

/** The one message to show under a control (server first, then the schema's, then built-ins). */
export function errorMessage(control: AbstractControl | null): string {
  const errors = control?.errors;
  if (!errors) return '';
  if (typeof errors['server'] === 'string') return errors['server'];
  if (typeof errors['zod'] === 'string') return errors['zod'];
  if (errors['required']) return 'Required.';
  if (errors['email']) return 'Enter a valid e-mail address.';
  if (errors['mismatch']) return 'The passwords do not match.';
  return 'Check this value.';
}
