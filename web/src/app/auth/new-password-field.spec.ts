import { TestBed } from '@angular/core/testing';
import { FormControl } from '@angular/forms';
import { NEW_PASSWORD_VALIDATORS, NewPasswordField } from './new-password-field';

describe('NewPasswordField (change-password and set-password forms)', () => {
  it('shows the label and hint, binds the parent control and applies the shared password rule', async () => {
    const control = new FormControl('', { nonNullable: true, validators: NEW_PASSWORD_VALIDATORS });
    const fixture = TestBed.createComponent(NewPasswordField);
    fixture.componentRef.setInput('control', control);
    await fixture.whenStable();
    const host = fixture.nativeElement as HTMLElement;
    expect(host.textContent).toContain('New password');
    expect(host.textContent).toContain('At least 12 characters.');
    const input = host.querySelector('input')!;
    expect(input.getAttribute('autocomplete')).toBe('new-password');

    input.value = 'short';
    input.dispatchEvent(new Event('input'));
    expect(control.value).toBe('short');
    expect(control.valid).toBe(false);
    control.setValue('a long enough pass phrase');
    expect(control.valid).toBe(true);
  });
});
