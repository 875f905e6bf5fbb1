import { HttpErrorResponse } from '@angular/common/http';
import { TestBed } from '@angular/core/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { MatButtonHarness } from '@angular/material/button/testing';
import { MATERIAL_ANIMATIONS } from '@angular/material/core';
import { MatFormFieldHarness } from '@angular/material/form-field/testing';
import { MatInputHarness } from '@angular/material/input/testing';
import { of, throwError } from 'rxjs';
import { ProviderService } from '../provider-service';
import { PROFILE } from './profile-fixture';
import { ProviderProfilePage } from './provider-profile';

const profile = PROFILE;

async function setup(save: jest.Mock) {
  TestBed.configureTestingModule({
    imports: [ProviderProfilePage],
    providers: [
      { provide: MATERIAL_ANIMATIONS, useValue: { animationsDisabled: true } },
      { provide: ProviderService, useValue: { profile: () => of(profile), save } },
    ],
  });
  const fixture = TestBed.createComponent(ProviderProfilePage);
  await fixture.whenStable();
  const loader = TestbedHarnessEnvironment.loader(fixture);
  const field = (label: string) =>
    loader.getHarness(MatFormFieldHarness.with({ floatingLabelText: label }));
  const input = async (label: string) => (await (await field(label)).getControl(MatInputHarness))!;
  const submit = () =>
    loader.getHarness(MatButtonHarness.with({ text: 'Save profile' })).then((b) => b.click());
  const text = () => (fixture.nativeElement as HTMLElement).textContent ?? '';
  return { field, input, submit, text };
}

describe('ProviderProfilePage', () => {
  it('saves the profile with the tax rate in basis points', async () => {
    const save = jest.fn(() => of({ ...profile, taxRateBp: 770 }));
    const { input, submit, text } = await setup(save);
    expect(await (await input('Provider name')).getValue()).toBe('Ringlet PT');
    await (await input('Tax rate on participation fees (%)')).setValue('7.7');
    await submit();
    expect(save).toHaveBeenCalledWith(
      expect.objectContaining({ name: 'Ringlet PT', taxRateBp: 770 }),
    );
    expect(text()).toContain('Saved.');
  });

  it('refuses an empty provider name without asking the server', async () => {
    const save = jest.fn();
    const { field, input, submit } = await setup(save);
    await (await input('Provider name')).setValue('');
    await submit();
    expect(save).not.toHaveBeenCalled();
    expect(await (await field('Provider name')).getTextErrors()).toEqual([
      'The provider’s name is required',
    ]);
  });

  it('puts the server refusal under the field it names', async () => {
    const refusal = new HttpErrorResponse({
      status: 400,
      error: {
        error: {
          code: 'validation_failed',
          message: 'Check the fields.',
          details: [{ path: 'website', message: 'Give an address starting with https://' }],
        },
      },
    });
    const { field, submit } = await setup(jest.fn(() => throwError(() => refusal)));
    await submit();
    expect(await (await field('Website')).getTextErrors()).toEqual([
      'Give an address starting with https://',
    ]);
  });
});
