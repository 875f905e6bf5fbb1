import type { Type } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { MAT_DIALOG_DATA, MatDialogRef } from '@angular/material/dialog';
import { MatButtonHarness } from '@angular/material/button/testing';
import { MATERIAL_ANIMATIONS } from '@angular/material/core';
import { MatFormFieldHarness } from '@angular/material/form-field/testing';
import { MatInputHarness } from '@angular/material/input/testing';
import { CreditDialog } from '../credit-dialog/credit-dialog';
import { MarkPaidDialog, type LedgerDialogData } from './mark-paid-dialog';

const data: LedgerDialogData = { number: 'INV-2026-0007', organisationName: 'Lab Seven' };

async function setup(component: Type<unknown>, confirm: string) {
  const close = jest.fn();
  TestBed.configureTestingModule({
    imports: [component],
    providers: [
      { provide: MATERIAL_ANIMATIONS, useValue: { animationsDisabled: true } },
      { provide: MAT_DIALOG_DATA, useValue: data },
      { provide: MatDialogRef, useValue: { close } },
    ],
  });
  const fixture = TestBed.createComponent(component);
  await fixture.whenStable();
  const loader = TestbedHarnessEnvironment.loader(fixture);
  const submit = await loader.getHarness(MatButtonHarness.with({ text: confirm }));
  return { loader, close, submit };
}

describe('MarkPaidDialog', () => {
  it('refuses a transfer without a bank reference', async () => {
    const { loader, close, submit } = await setup(MarkPaidDialog, 'Mark paid');
    await submit.click();
    expect(close).not.toHaveBeenCalled();
    const field = await loader.getHarness(
      MatFormFieldHarness.with({ floatingLabelText: 'Bank reference' }),
    );
    expect(await field.getTextErrors()).toEqual(['Enter the bank reference.']);
  });

  it('closes with the reference and the day the money arrived', async () => {
    const { loader, close, submit } = await setup(MarkPaidDialog, 'Mark paid');
    const [reference, paidOn] = await loader.getAllHarnesses(MatInputHarness);
    await reference!.setValue('  TR-2026-55 ');
    await paidOn!.setValue('2026-03-02');
    await submit.click();
    expect(close).toHaveBeenCalledWith({ reference: 'TR-2026-55', paidOn: '2026-03-02' });
  });
});

describe('CreditDialog', () => {
  it('needs a reason, then closes with it', async () => {
    const { loader, close, submit } = await setup(CreditDialog, 'Issue credit note');
    await submit.click();
    expect(close).not.toHaveBeenCalled();
    await (await loader.getHarness(MatInputHarness)).setValue('Lab withdrew before dispatch');
    await submit.click();
    expect(close).toHaveBeenCalledWith('Lab withdrew before dispatch');
  });
});
