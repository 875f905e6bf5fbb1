import { FormControl, FormGroup } from '@angular/forms';
import * as z from 'zod';
import { SignInRequest } from '@ringlet/shared/contracts/auth';
import {
  applyServerIssues,
  applyZodIssues,
  errorMessage,
  parseForm,
  zodValidator,
} from './zod-form-errors';

describe('zod form errors', () => {
  const signInForm = () =>
    new FormGroup({
      email: new FormControl('', { nonNullable: true }),
      password: new FormControl('', { nonNullable: true }),
    });

  it('zodValidator reports the schema message', () => {
    const control = new FormControl('not-an-address', {
      nonNullable: true,
      validators: zodValidator(SignInRequest.shape.email),
    });
    expect(control.errors).toEqual({ zod: 'Enter a valid e-mail address.' });
    control.setValue('lab@example.test');
    expect(control.errors).toBeNull();
  });

  it('parseForm puts each zod issue under its field and returns null', () => {
    const form = signInForm();
    form.setValue({ email: 'nope', password: '' });
    const result = parseForm(form, SignInRequest);
    expect(result.value).toBeNull();
    expect(errorMessage(form.controls.email)).toBe('Enter a valid e-mail address.');
    expect(errorMessage(form.controls.password)).toBe('Enter your password.');
    expect(form.controls.email.touched).toBe(true);
  });

  it('parseForm returns the parsed value (trimmed, lower-cased) when valid', () => {
    const form = signInForm();
    form.setValue({ email: '  Lab@Example.TEST ', password: 'secret' });
    expect(parseForm(form, SignInRequest)).toEqual({
      value: { email: 'lab@example.test', password: 'secret' },
      unplaced: [],
    });
  });

  it('applyZodIssues handles nested paths and returns issues that name no field', () => {
    const form = new FormGroup({ lab: new FormGroup({ name: new FormControl('') }) });
    const schema = z
      .object({ lab: z.object({ name: z.string().min(2, { message: 'Too short.' }) }) })
      .refine(() => false, {
        message: 'Whole form problem.',
      });
    const parsed = schema.safeParse({ lab: { name: 'x' } });
    expect(parsed.success).toBe(false);
    const unplaced = applyZodIssues(form, parsed.error!.issues);
    expect(form.get('lab.name')?.errors).toEqual({ zod: 'Too short.' });
    expect(unplaced).toEqual(['Whole form problem.']);
  });

  it("applyServerIssues shows the server's 400 field errors under the right field", () => {
    const form = signInForm();
    const unplaced = applyServerIssues(form, [
      { path: 'email', message: 'This address is already invited.' },
      { path: 'unknownField', message: 'Something else.' },
    ]);
    expect(errorMessage(form.controls.email)).toBe('This address is already invited.');
    expect(form.controls.password.errors).toBeNull();
    expect(unplaced).toEqual(['Something else.']);
  });
});
