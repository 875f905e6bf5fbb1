import { FormControl, FormGroup } from '@angular/forms';
import { Subject, throwError } from 'rxjs';
import * as z from 'zod';
import { FormSubmit, placeProblem } from './form-submit';
import { problemResponse } from './form-testing';

const problem = problemResponse;

function aForm() {
  return new FormGroup({ email: new FormControl(''), name: new FormControl('') });
}

describe('placeProblem', () => {
  it("puts a 400's field issues under their controls and answers no message", () => {
    const form = aForm();
    const error = problem(400, 'Invalid input', [{ path: 'email', message: 'Not an e-mail.' }]);
    expect(placeProblem(form, error)).toBeNull();
    expect(form.controls.email.errors).toEqual({ server: 'Not an e-mail.' });
    expect(form.controls.email.touched).toBe(true);
  });

  it('answers the issues that name no control, or the given message when all are placed', () => {
    const error = problem(400, 'Invalid input', [
      { path: 'email', message: 'Not an e-mail.' },
      { path: 'roles', message: 'Pick a role.' },
    ]);
    expect(placeProblem(aForm(), error)).toBe('Pick a role.');
    const placed = problem(400, 'Invalid input', [{ path: 'name', message: 'Too long.' }]);
    expect(placeProblem(aForm(), placed, { placed: 'Check the highlighted fields.' })).toBe(
      'Check the highlighted fields.',
    );
  });

  it('maps contract paths to control paths', () => {
    const form = aForm();
    const error = problem(400, 'Invalid input', [{ path: 'items.0.name', message: 'Too long.' }]);
    expect(placeProblem(form, error, { map: (p) => p.replace('items.0.', '') })).toBeNull();
    expect(form.controls.name.errors).toEqual({ server: 'Too long.' });
  });

  it('puts a 422 rule break that names a field under it: details or "field: words"', () => {
    const form = aForm();
    const details = problem(422, 'Staff cannot join', [
      { path: 'email', message: 'This is a PT provider account.' },
    ]);
    expect(placeProblem(form, details)).toBeNull();
    expect(form.controls.email.errors).toEqual({ server: 'This is a PT provider account.' });
    const named = problem(409, 'name: already taken');
    expect(placeProblem(form, named)).toBeNull();
    expect(form.controls.name.errors).toEqual({ server: 'already taken' });
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
    expect(submit.parse(Schema, { email: 'a@b.test', name: ' Ana ' })).toEqual({
      email: 'a@b.test',
      name: 'Ana',
    });
    expect(submit.parse(Schema, { email: 'nope', name: 'Ana' })).toBeNull();
    expect(form.controls.email.errors).toEqual({ zod: 'Enter an e-mail.' });
    expect(submit.failure()).toBeNull();
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

  it('keeps a refusal on the form and is no longer busy', () => {
    const submit = new FormSubmit(aForm());
    const done = jest.fn();
    submit.run(
      throwError(() => problem(409, 'This changed meanwhile.')),
      done,
    );
    expect(done).not.toHaveBeenCalled();
    expect(submit.busy()).toBe(false);
    expect(submit.failure()).toBe('This changed meanwhile.');
  });
});
