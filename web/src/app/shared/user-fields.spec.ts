import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { NonNullableFormBuilder, Validators } from '@angular/forms';
import { MatFormFieldHarness } from '@angular/material/form-field/testing';
import { MatSelectHarness } from '@angular/material/select/testing';
import type { GlobalRole } from '@ringlet/shared/contracts/auth';
import { applyServerIssues } from '../core/zod-form-errors';
import { formFields, renderHost } from './form-testing';
import { UserFields } from './user-fields';

@Component({
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [UserFields],
  template: `<app-user-fields
    [name]="form.controls.name"
    [roles]="form.controls.roles"
    rolesHint="Leave empty for a lab member only."
  />`,
})
class Host {
  readonly form = inject(NonNullableFormBuilder).group({
    name: ['', [Validators.required]],
    roles: [[] as GlobalRole[]],
  });
}

const setup = () => renderHost(Host);

describe('UserFields', () => {
  it("fills the parent's name and roles controls", async () => {
    const { fixture, loader } = await setup();
    await formFields(loader).fill('Name', 'Mira Okafor');
    const roles = await loader.getHarness(MatSelectHarness);
    await roles.open();
    await roles.clickOptions({ text: 'Coordinator' });
    await roles.clickOptions({ text: 'Assessor' });
    expect(fixture.componentInstance.form.getRawValue()).toEqual({
      name: 'Mira Okafor',
      roles: ['coordinator', 'assessor'],
    });
    const hint = await loader.getHarness(MatFormFieldHarness.with({ floatingLabelText: 'Roles' }));
    expect(await hint.getTextHints()).toEqual(['Leave empty for a lab member only.']);
  });

  it('shows an issue the server placed on roles under that field', async () => {
    const { fixture, loader } = await setup();
    applyServerIssues(fixture.componentInstance.form, [
      { path: 'roles', message: 'An assessor cannot also be an administrator.' },
    ]);
    fixture.detectChanges();
    const roles = await formFields(loader).field('Roles');
    expect(await roles.getTextErrors()).toEqual(['An assessor cannot also be an administrator.']);
  });
});
