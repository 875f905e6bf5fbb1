import { HttpErrorResponse } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import type { ComponentType } from '@angular/cdk/portal';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { MATERIAL_ANIMATIONS } from '@angular/material/core';
import { MatButtonHarness } from '@angular/material/button/testing';
import { MatDialog } from '@angular/material/dialog';
import { MatDialogHarness } from '@angular/material/dialog/testing';
import { MatFormFieldHarness } from '@angular/material/form-field/testing';
import { MatInputHarness } from '@angular/material/input/testing';
import { of, throwError } from 'rxjs';
import { settle } from '../../core/testing';
import { openDialog } from '../../shared/open-dialog';
import { ItemDialog, type ItemDialogData } from '../item-dialog/item-dialog';
import { RoundDialog, type RoundDialogData } from '../round-dialog/round-dialog';
import { RoundEditDialog } from '../round-edit-dialog/round-edit-dialog';
import { RoundsService } from '../rounds-service';
import { aRound } from './round-fixture';

@Component({ selector: 'app-host', template: '', changeDetection: ChangeDetectionStrategy.OnPush })
class Host {
  readonly dialog = inject(MatDialog);
}

async function open<D>(component: ComponentType<unknown>, data: D, api: Partial<RoundsService>) {
  TestBed.configureTestingModule({
    imports: [Host],
    providers: [
      { provide: MATERIAL_ANIMATIONS, useValue: { animationsDisabled: true } },
      { provide: RoundsService, useValue: api },
    ],
  });
  const fixture = TestBed.createComponent(Host);
  const after = jest.fn();
  openDialog(fixture.componentInstance.dialog, component, data, '720px', after);
  const loader = TestbedHarnessEnvironment.documentRootLoader(fixture);
  const dialog = await loader.getHarness(MatDialogHarness);
  const input = async (label: string) => {
    const field = await dialog.getHarness(MatFormFieldHarness.with({ floatingLabelText: label }));
    return (await field.getControl(MatInputHarness))!;
  };
  const click = async (text: string) => {
    await (await dialog.getHarness(MatButtonHarness.with({ text }))).click();
    await settle();
    await fixture.whenStable();
  };
  return { dialog, after, input, click };
}

const SCHEME = { id: '0b8f4d7e-5c1a-4e9b-8f3d-2a6c9e1b7d40', code: 'NANO-DLS', name: 'DLS' };

describe('the round dialogs', () => {
  afterEach(() => document.body.replaceChildren());

  it('new round: the shared terms and an item go out as one parsed round', async () => {
    const createRound = jest.fn(() => of(aRound()));
    const data = { schemes: [SCHEME] } as unknown as RoundDialogData;
    const { after, input, click } = await open(RoundDialog, data, { createRound });
    await (await input('Round code')).setValue('DLS-2026-1');
    await (await input('Title')).setValue('Latex, spring 2026');
    await (await input('Participation fee')).setValue('120.5');
    await (await input('Item code')).setValue('A');
    await (await input('Material')).setValue('Polystyrene latex in water');
    await click('Create round');
    expect(createRound).toHaveBeenCalledWith(
      expect.objectContaining({
        code: 'DLS-2026-1',
        title: 'Latex, spring 2026',
        feeMinor: 12050,
        currency: 'EUR',
        protocolTemperatureC: 25,
        resultsDueAt: null,
        items: [expect.objectContaining({ code: 'A', nominalSizeNm: null })],
      }),
    );
    expect(after).toHaveBeenCalledWith(aRound().id);
  });

  it('edit round: the fee is fixed after draft, and only the changed field is sent', async () => {
    const round = aRound({ state: 'enrolling' });
    const updateRound = jest.fn(() => of(round));
    const { dialog, after, input, click } = await open(RoundEditDialog, round, { updateRound });
    expect(await (await input('Participation fee')).isDisabled()).toBe(true);
    expect(await dialog.getText()).toContain('Fixed once enrolment has opened.');
    await (await input('Title')).setValue('Latex, spring 2026 (revised)');
    await click('Save changes');
    expect(updateRound).toHaveBeenCalledWith(round.id, { title: 'Latex, spring 2026 (revised)' });
    expect(after).toHaveBeenCalledWith(round);
  });

  it('item: a 409 naming the code shows above the buttons and under the field', async () => {
    const error = new HttpErrorResponse({
      status: 409,
      error: { error: { code: 'conflict', message: 'code: the round already has a test item a.' } },
    });
    const addItems = jest.fn(() => throwError(() => error));
    const data: ItemDialogData = { roundId: aRound().id };
    const { dialog, after, input, click } = await open(ItemDialog, data, { addItems });
    await (await input('Item code')).setValue('a');
    await (await input('Material')).setValue('Gold colloid in citrate buffer');
    await click('Add item');
    expect(addItems).toHaveBeenCalledWith(aRound().id, [
      expect.objectContaining({ code: 'a', material: 'Gold colloid in citrate buffer' }),
    ]);
    const code = await dialog.getHarness(
      MatFormFieldHarness.with({ floatingLabelText: 'Item code' }),
    );
    expect(await code.getTextErrors()).toEqual(['The round already has a test item a.']);
    expect(
      await (await dialog.getHarness(MatButtonHarness.with({ text: 'Add item' }))).isDisabled(),
    ).toBe(false);
    expect(after).not.toHaveBeenCalled();
  });
});
