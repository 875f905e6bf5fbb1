import { HttpErrorResponse } from '@angular/common/http';
import { TestBed } from '@angular/core/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { MAT_DIALOG_DATA, MatDialogRef } from '@angular/material/dialog';
import { MatButtonHarness } from '@angular/material/button/testing';
import { MatFormFieldHarness } from '@angular/material/form-field/testing';
import { MatInputHarness } from '@angular/material/input/testing';
import type { PrecisionExclusion } from '@ringlet/shared/contracts/precision';
import { of } from 'rxjs';
import { finishRefusal } from './finish-dialog';
import { PrecisionService } from './precision-service';
import { WithdrawDialog, type WithdrawDialogData } from './withdraw-dialog';

describe('WithdrawDialog', () => {
  const decision = {
    id: '7f0c1c2e-58c4-4c36-9a4e-3d8d2b0f4a11',
    participantCode: 'L7',
    replicate: 2,
    decision: 'confirmed',
    reason: 'bubble in the cuvette',
  } as PrecisionExclusion;
  const data: WithdrawDialogData = { roundId: 'r1', decision };

  async function setup() {
    const close = jest.fn();
    const withdraw = jest.fn().mockReturnValue(of({ answered: true }));
    TestBed.configureTestingModule({
      imports: [WithdrawDialog],
      providers: [
        { provide: MAT_DIALOG_DATA, useValue: data },
        { provide: MatDialogRef, useValue: { close } },
        { provide: PrecisionService, useValue: { withdraw } },
      ],
    });
    const fixture = TestBed.createComponent(WithdrawDialog);
    const loader = TestbedHarnessEnvironment.loader(fixture);
    const submit = await loader.getHarness(MatButtonHarness.with({ text: 'Withdraw' }));
    return { loader, close, withdraw, submit };
  }

  it('refuses to send without a reason', async () => {
    const { loader, close, withdraw, submit } = await setup();
    await submit.click();
    expect(withdraw).not.toHaveBeenCalled();
    expect(close).not.toHaveBeenCalled();
    const field = await loader.getHarness(
      MatFormFieldHarness.with({ floatingLabelText: 'Reason' }),
    );
    expect(await field.isControlValid()).toBe(false);
  });

  it('sends the trimmed reason for this decision and closes with the answer', async () => {
    const { loader, close, withdraw, submit } = await setup();
    await (await loader.getHarness(MatInputHarness)).setValue('  wrong cell chosen ');
    await submit.click();
    expect(withdraw).toHaveBeenCalledWith('r1', decision.id, { reason: 'wrong cell chosen' });
    expect(close).toHaveBeenCalledWith({ answered: true });
  });
});

describe('finishRefusal', () => {
  const refusal = (code: string, details?: unknown) =>
    new HttpErrorResponse({ status: 422, error: { error: { code, message: 'x', details } } });

  it('says in plain words how many flags wait for a decision', () => {
    expect(finishRefusal(refusal('undecided_flags', { pending: [{}, {}] }))).toBe(
      'Decide every flag first: 2 flags have no decision yet.',
    );
    expect(finishRefusal(refusal('undecided_flags'))).toBe('Decide every flag first.');
  });
});
