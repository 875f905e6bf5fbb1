import { HttpErrorResponse } from '@angular/common/http';
import { FormControl, FormGroup } from '@angular/forms';
import { of, Subject, throwError } from 'rxjs';
import * as z from 'zod';
import { errorMessage } from '../core/zod-form-errors';
import { CHECK_FIELDS, FormSubmit, pathMap, placeProblem } from './form-submit';
import { problemResponse } from './form-testing';

const problem = problemResponse;

function aForm() {
  return new FormGroup({ email: new FormControl(''), name: new FormControl('') });
}

describe('pathMap', () => {
  it('strips a batch prefix and renames fields', () => {
    const map = pathMap('items.0.', { feeMinor: 'fee' });
    expect(map('items.0.code')).toBe('code');
    expect(map('feeMinor')).toBe('fee');
    expect(map('items.1.code')).toBe('items.1.code');
  });
});

describe('placeProblem', () => {
  it("puts a 400's field issues under their controls and asks to check them", () => {
    const form = aForm();
    const error = problem(400, 'Invalid input', [{ path: 'email', message: 'Not an e-mail.' }]);
    expect(placeProblem(form, error)).toBe(CHECK_FIELDS);
    expect(CHECK_FIELDS).toBe('Check the highlighted fields.');
    expect(form.controls.email.errors).toEqual({ server: 'Not an e-mail.' });
    expect(form.controls.email.touched).toBe(true);
  });

  it('answers the issues that name no control', () => {
    const error = problem(400, 'Invalid input', [
      { path: 'email', message: 'Not an e-mail.' },
      { path: 'roles', message: 'Pick a role.' },
    ]);
    expect(placeProblem(aForm(), error)).toBe('Pick a role.');
  });

  it('maps contract paths to control paths', () => {
    const form = aForm();
    const error = problem(400, 'Invalid input', [{ path: 'items.0.name', message: 'Too long.' }]);
    expect(placeProblem(form, error, { map: pathMap('items.0.') })).toBe(CHECK_FIELDS);
    expect(form.controls.name.errors).toEqual({ server: 'Too long.' });
  });

  it('puts a 409/422 rule break that names a field under it: details or "field: words"', () => {
    const form = aForm();
    const details = problem(422, 'Staff cannot join', [
      { path: 'email', message: 'This is a PT provider account.' },
    ]);
    expect(placeProblem(form, details)).toBe(CHECK_FIELDS);
    expect(form.controls.email.errors).toEqual({ server: 'This is a PT provider account.' });
    const named = problem(409, 'name: already taken');
    expect(placeProblem(form, named)).toBe(CHECK_FIELDS);
    expect(form.controls.name.errors).toEqual({ server: 'Already taken' });
  });

  it("shows any other refusal in the server's words, or the given wording", () => {
    const form = aForm();
    expect(placeProblem(form, problem(409, 'The study is finished.'))).toBe(
      'The study is finished.',
    );
    expect(placeProblem(form, problem(422, 'endsOn: before the start'))).toBe(
      'Ends on: before the start',
    );
    expect(placeProblem(null, problem(422, 'x'), { refusal: () => 'Decide first.' })).toBe(
      'Decide first.',
    );
    expect(form.controls.email.errors).toBeNull();
  });
});

describe('FormSubmit', () => {
  const Schema = z.object({ email: z.email('Enter an e-mail.'), name: z.string().trim().min(1) });

  it('parses with the contract, or puts the issues under the controls', () => {
    const form = aForm();
    const submit = new FormSubmit(form);
    expect(submit.parse(Schema, { email: 'nope', name: 'Ana' })).toBeNull();
    expect(form.controls.email.errors).toEqual({ zod: 'Enter an e-mail.' });
    expect(submit.failure()).toBe(CHECK_FIELDS);
    expect(submit.parse(Schema, { email: 'a@b.test', name: ' Ana ' })).toEqual({
      email: 'a@b.test',
      name: 'Ana',
    });
    expect(submit.failure()).toBeNull();
  });

  it('submit: runs the call with the parsed value only when it fits the schema', () => {
    const submit = new FormSubmit(aForm());
    const call = jest.fn((v: z.output<typeof Schema>) => of(v.name));
    const done = jest.fn();
    submit.submit(Schema, { email: 'a@b.test', name: ' ' }, call, done);
    expect(call).not.toHaveBeenCalled();
    submit.submit(Schema, { email: 'a@b.test', name: ' Bo ' }, call, done);
    expect(call).toHaveBeenCalledWith({ email: 'a@b.test', name: 'Bo' });
    expect(done).toHaveBeenCalledWith('Bo');
  });

  it('is busy while the call runs and hands on the result', () => {
    const submit = new FormSubmit(aForm());
    const answer = new Subject<string>();
    const done = jest.fn();
    submit.run(answer, done);
    expect(submit.busy()).toBe(true);
    answer.next('ok');
    expect(submit.busy()).toBe(false);
    expect(done).toHaveBeenCalledWith('ok');
  });

  it('puts a 400 under the fields its paths name (mapped), the rest above the buttons', () => {
    const form = new FormGroup({ code: new FormControl(''), fee: new FormControl(0) });
    const submit = new FormSubmit(form, { map: pathMap('items.0.', { feeMinor: 'fee' }) });
    const error = problem(400, 'Invalid', [
      { path: 'items.0.code', message: 'Too long.' },
      { path: 'feeMinor', message: 'Too high.' },
      { path: 'items.0.unit', message: 'Unknown unit.' },
    ]);
    const done = jest.fn();
    submit.run(
      throwError(() => error),
      done,
    );
    expect(done).not.toHaveBeenCalled();
    expect(submit.busy()).toBe(false);
    expect(errorMessage(form.controls.code)).toBe('Too long.');
    expect(errorMessage(form.controls.fee)).toBe('Too high.');
    expect(submit.failure()).toBe('Unknown unit.');
  });

  it('keeps a refusal on the form, is no longer busy, and clears it on the next try', () => {
    const submit = new FormSubmit(aForm());
    const done = jest.fn();
    submit.run(
      throwError(() => problem(409, 'This changed meanwhile.')),
      done,
    );
    expect(done).not.toHaveBeenCalled();
    expect(submit.busy()).toBe(false);
    expect(submit.failure()).toBe('This changed meanwhile.');
    submit.run(
      throwError(() => new HttpErrorResponse({ status: 0 })),
      done,
    );
    expect(submit.failure()).toContain('cannot be reached');
    submit.run(of(1), done);
    expect(submit.failure()).toBeNull();
    expect(done).toHaveBeenCalledWith(1);
  });
});
