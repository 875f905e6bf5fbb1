import { HttpErrorResponse } from '@angular/common/http';
import { FormControl, FormGroup } from '@angular/forms';
import { of, Subject, throwError } from 'rxjs';
import * as z from 'zod';
import { errorMessage } from '../core/zod-form-errors';
import { DialogSubmit } from './dialog-submit';
import { pathMap } from './form-errors';

const problem = (status: number, message: string, details?: unknown) =>
  new HttpErrorResponse({ status, error: { error: { code: 'x', message, details } } });

function aForm() {
  const form = new FormGroup({ code: new FormControl(''), fee: new FormControl(0) });
  return { form, submit: new DialogSubmit(form, pathMap('items.0.', { feeMinor: 'fee' })) };
}

describe('DialogSubmit', () => {
  it('parses with the contract: issues under their controls, nothing sent', () => {
    const { form, submit } = aForm();
    const Schema = z.object({ code: z.string().min(1, { message: 'Enter a code.' }) });
    expect(submit.parse(Schema, { code: '' })).toBeNull();
    expect(errorMessage(form.controls.code)).toBe('Enter a code.');
    expect(submit.failure()).toBe('Check the highlighted fields.');
    expect(submit.parse(Schema, { code: 'A' })).toEqual({ code: 'A' });
    expect(submit.failure()).toBeNull();
  });

  it('submit: sends the parsed value only when it fits the schema', () => {
    const { submit } = aForm();
    const Schema = z.object({ code: z.string().trim().min(1, { message: 'Enter a code.' }) });
    const call = jest.fn((v: { code: string }) => of(v.code));
    const done = jest.fn();
    submit.submit(Schema, { code: ' ' }, call, done);
    expect(call).not.toHaveBeenCalled();
    submit.submit(Schema, { code: ' B ' }, call, done);
    expect(call).toHaveBeenCalledWith({ code: 'B' });
    expect(done).toHaveBeenCalledWith('B');
  });

  it('is busy while the call runs and hands the answer on', () => {
    const { submit } = aForm();
    const call = new Subject<string>();
    const done = jest.fn();
    submit.send(call, done);
    expect(submit.busy()).toBe(true);
    call.next('r1');
    expect(submit.busy()).toBe(false);
    expect(done).toHaveBeenCalledWith('r1');
  });

  it('puts a 400 problem under the fields its paths name (mapped), the rest above', () => {
    const { form, submit } = aForm();
    const error = problem(400, 'Invalid', [
      { path: 'items.0.code', message: 'Too long.' },
      { path: 'feeMinor', message: 'Too high.' },
    ]);
    const done = jest.fn();
    submit.send(
      throwError(() => error),
      done,
    );
    expect(done).not.toHaveBeenCalled();
    expect(submit.busy()).toBe(false);
    expect(errorMessage(form.controls.code)).toBe('Too long.');
    expect(errorMessage(form.controls.fee)).toBe('Too high.');
    expect(submit.failure()).toBe('Check the highlighted fields.');
  });

  it('shows a 409 rule message above the buttons and under the field it names', () => {
    const { form, submit } = aForm();
    submit.send(
      throwError(() => problem(409, 'code: the round already has a test item a.')),
      jest.fn(),
    );
    expect(submit.failure()).toBe('The round already has a test item a.');
    expect(errorMessage(form.controls.code)).toBe('The round already has a test item a.');
  });

  it('shows any other error as its readable message and clears it on the next try', () => {
    const { submit } = aForm();
    submit.send(
      throwError(() => new HttpErrorResponse({ status: 0 })),
      jest.fn(),
    );
    expect(submit.failure()).toContain('cannot be reached');
    submit.send(of(1), jest.fn());
    expect(submit.failure()).toBeNull();
  });
});
