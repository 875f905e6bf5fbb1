import { TestBed } from '@angular/core/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { MATERIAL_ANIMATIONS } from '@angular/material/core';
import { MAT_DIALOG_DATA, MatDialogRef } from '@angular/material/dialog';
import { type Observable, of, throwError } from 'rxjs';
import type { User } from '@ringlet/shared/contracts/admin';
import { formFields, problemResponse } from '../shared/form-testing';
import { AdminService } from './admin-service';
import { InviteUserDialog } from './invite-user-dialog';

const invited = { id: 'u1', name: 'Ines Duarte' } as User;

async function setup(answer: Observable<User> = of(invited)) {
  const inviteUser = jest.fn(() => answer);
  const close = jest.fn();
  TestBed.configureTestingModule({
    imports: [InviteUserDialog],
    providers: [
      { provide: MATERIAL_ANIMATIONS, useValue: { animationsDisabled: true } },
      { provide: AdminService, useValue: { inviteUser } },
      { provide: MatDialogRef, useValue: { close } },
      { provide: MAT_DIALOG_DATA, useValue: { labs: [] } },
    ],
  });
  const fixture = TestBed.createComponent(InviteUserDialog);
  await fixture.whenStable();
  const loader = TestbedHarnessEnvironment.loader(fixture);
  const { field, fill, press } = formFields(loader);
  const send = () => press('Send invitation');
  return { fixture, inviteUser, close, field, fill, send };
}

describe('InviteUserDialog', () => {
  it('sends the invitation and closes with the new user', async () => {
    const { inviteUser, close, fill, send } = await setup();
    await fill('E-mail', 'ines.duarte@example.test');
    await fill('Name', 'Ines Duarte');
    await send();
    expect(inviteUser).toHaveBeenCalledWith(
      expect.objectContaining({ email: 'ines.duarte@example.test', name: 'Ines Duarte' }),
    );
    expect(close).toHaveBeenCalledWith(invited);
  });

  it("puts the server's 400 under its field and stays open", async () => {
    const taken = problemResponse(400, 'Invalid input', [
      { path: 'email', message: 'This address is already in use.' },
    ]);
    const first = await setup(throwError(() => taken));
    await first.fill('E-mail', 'ines.duarte@example.test');
    await first.fill('Name', 'Ines Duarte');
    await first.send();
    expect(first.close).not.toHaveBeenCalled();
    expect(await (await first.field('E-mail')).getTextErrors()).toEqual([
      'This address is already in use.',
    ]);
  });

  it('shows a refusal that names no field above the buttons', async () => {
    const conflict = problemResponse(409, 'The lab was removed meanwhile.');
    const { fixture, close, fill, send } = await setup(throwError(() => conflict));
    await fill('E-mail', 'ines.duarte@example.test');
    await fill('Name', 'Ines Duarte');
    await send();
    expect(close).not.toHaveBeenCalled();
    const alert = (fixture.nativeElement as HTMLElement).querySelector('[role="alert"]');
    expect(alert?.textContent).toContain('The lab was removed meanwhile.');
  });
});
