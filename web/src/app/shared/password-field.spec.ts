import { TestBed } from '@angular/core/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { FormControl, Validators } from '@angular/forms';
import { MatFormFieldHarness } from '@angular/material/form-field/testing';
import { MatInputHarness } from '@angular/material/input/testing';
import { PasswordField } from './password-field';

async function setup(hint = '') {
  const control = new FormControl('', { nonNullable: true, validators: Validators.required });
  const fixture = TestBed.createComponent(PasswordField);
  fixture.componentRef.setInput('control', control);
  fixture.componentRef.setInput('label', 'Current password');
  fixture.componentRef.setInput('autocomplete', 'current-password');
  fixture.componentRef.setInput('hint', hint);
  await fixture.whenStable();
  const loader = TestbedHarnessEnvironment.loader(fixture);
  return { control, field: await loader.getHarness(MatFormFieldHarness), loader };
}

describe('PasswordField', () => {
  it('a password box with its label and autocomplete kind, bound to the parent control', async () => {
    const { control, field, loader } = await setup();
    expect(await field.getLabel()).toBe('Current password');
    expect(await field.getTextHints()).toEqual([]);
    const input = await loader.getHarness(MatInputHarness);
    expect(await input.getType()).toBe('password');
    expect(await (await input.host()).getAttribute('autocomplete')).toBe('current-password');
    await input.setValue('old phrase');
    expect(control.value).toBe('old phrase');
  });

  it('shows its hint, and the error once touched and empty', async () => {
    const { control, field } = await setup('At least 12 characters.');
    expect(await field.getTextHints()).toEqual(['At least 12 characters.']);
    control.markAsTouched();
    control.setValue('');
    expect(await field.getTextErrors()).toHaveLength(1);
  });
});
