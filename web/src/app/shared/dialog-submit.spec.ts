import { TestBed } from '@angular/core/testing';
import { FormControl, FormGroup } from '@angular/forms';
import { MAT_DIALOG_DATA, MatDialogRef } from '@angular/material/dialog';
import { of, throwError } from 'rxjs';
import * as z from 'zod';
import { CHECK_FIELDS } from './form-submit';
import { dialogData, DialogSubmit } from './dialog-submit';
import { problemResponse } from './form-testing';

const Body = z.object({ name: z.string().min(1, 'Enter a name.') });

function setup() {
  const close = jest.fn();
  TestBed.configureTestingModule({
    providers: [
      { provide: MatDialogRef, useValue: { close } },
      { provide: MAT_DIALOG_DATA, useValue: { roundId: 'r1' } },
    ],
  });
  const form = new FormGroup({ name: new FormControl('') });
  const submit = TestBed.runInInjectionContext(() => new DialogSubmit<string>(form));
  return { close, form, submit };
}

describe('DialogSubmit', () => {
  it('closes with the call’s result once the value fits', () => {
    const { close, submit } = setup();
    submit.submitAndClose(Body, { name: 'Ridge Lab' }, (v) => of(`saved ${v.name}`));
    expect(close).toHaveBeenCalledWith('saved Ridge Lab');
    expect(submit.busy()).toBe(false);
  });

  it('stays open with the issue under its field when the value does not fit', () => {
    const { close, form, submit } = setup();
    const call = jest.fn(() => of('x'));
    submit.submitAndClose(Body, { name: '' }, call);
    expect(call).not.toHaveBeenCalled();
    expect(close).not.toHaveBeenCalled();
    expect(form.controls.name.errors).toEqual({ zod: 'Enter a name.' });
    expect(submit.failure()).toBe(CHECK_FIELDS);
  });

  it('stays open with a refusal in the message', () => {
    const { close, submit } = setup();
    submit.runAndClose(throwError(() => problemResponse(409, 'The round is closed.')));
    expect(close).not.toHaveBeenCalled();
    expect(submit.failure()).toBe('The round is closed.');
  });

  it('reads the data the dialog was opened with', () => {
    setup();
    expect(TestBed.runInInjectionContext(() => dialogData<{ roundId: string }>())).toEqual({
      roundId: 'r1',
    });
  });
});
