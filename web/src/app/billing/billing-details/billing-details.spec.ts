import { TestBed } from '@angular/core/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { MatButtonHarness } from '@angular/material/button/testing';
import { MATERIAL_ANIMATIONS } from '@angular/material/core';
import { MatFormFieldHarness } from '@angular/material/form-field/testing';
import { MatInputHarness } from '@angular/material/input/testing';
import { MatSnackBar } from '@angular/material/snack-bar';
import { of } from 'rxjs';
import { BillingService } from '../billing-service';
import { BillingDetails } from './billing-details';

const stored = {
  organisationId: 'lab-1',
  billingName: 'Lab One',
  address: 'Street 1',
  taxId: '',
  poNumber: '',
  updatedAt: null,
};

async function setup() {
  const saveDetails = jest.fn(() => of(stored));
  const open = jest.fn();
  TestBed.configureTestingModule({
    imports: [BillingDetails],
    providers: [
      { provide: MATERIAL_ANIMATIONS, useValue: { animationsDisabled: true } },
      { provide: BillingService, useValue: { details: () => of(stored), saveDetails } },
      { provide: MatSnackBar, useValue: { open } },
    ],
  });
  const fixture = TestBed.createComponent(BillingDetails);
  let saved = 0;
  fixture.componentInstance.saved.subscribe(() => saved++);
  await fixture.whenStable();
  const loader = TestbedHarnessEnvironment.loader(fixture);
  return { fixture, loader, saveDetails, open, saved: () => saved };
}

describe('BillingDetails', () => {
  it('shows the stored details and saves the changed ones', async () => {
    const { loader, saveDetails, open, saved } = await setup();
    const inputs = await loader.getAllHarnesses(MatInputHarness);
    expect(await inputs[0]!.getValue()).toBe('Lab One');
    await inputs[3]!.setValue('PO-2026-17');
    await (
      await loader.getHarness(MatButtonHarness.with({ text: 'Save billing details' }))
    ).click();
    expect(saveDetails).toHaveBeenCalledWith({
      billingName: 'Lab One',
      address: 'Street 1',
      taxId: '',
      poNumber: 'PO-2026-17',
    });
    expect(open).toHaveBeenCalledWith('Billing details saved.', 'Close', { duration: 4000 });
    expect(saved()).toBe(1);
  });

  it('refuses an empty name to bill and says so under the field', async () => {
    const { loader, saveDetails, saved } = await setup();
    const inputs = await loader.getAllHarnesses(MatInputHarness);
    await inputs[0]!.setValue('');
    await (
      await loader.getHarness(MatButtonHarness.with({ text: 'Save billing details' }))
    ).click();
    expect(saveDetails).not.toHaveBeenCalled();
    expect(saved()).toBe(0);
    const name = await loader.getHarness(
      MatFormFieldHarness.with({ floatingLabelText: 'Name to bill' }),
    );
    expect(await name.getTextErrors()).toEqual(['Enter the name to bill.']);
  });
});
