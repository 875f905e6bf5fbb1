import { TestBed } from '@angular/core/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { MATERIAL_ANIMATIONS } from '@angular/material/core';
import { MatSnackBar } from '@angular/material/snack-bar';
import { type Observable, of, throwError } from 'rxjs';
import type { AssessorGrantDto } from '@ringlet/shared/contracts/evaluation';
import { formFields, problemResponse } from '../../../shared/form-testing';
import { aGrant, GRANT_LAB } from '../grant-fixtures';
import { LabMembersService } from '../lab-members-service';
import { GrantForm } from './grant-form';

const LAB = GRANT_LAB;
const saved = aGrant();

async function setup(answer: Observable<AssessorGrantDto> = of(saved)) {
  const grant = jest.fn(() => answer);
  TestBed.configureTestingModule({
    imports: [GrantForm],
    providers: [
      { provide: MATERIAL_ANIMATIONS, useValue: { animationsDisabled: true } },
      { provide: LabMembersService, useValue: { grant } },
      { provide: MatSnackBar, useValue: { open: jest.fn() } },
    ],
  });
  const fixture = TestBed.createComponent(GrantForm);
  fixture.componentRef.setInput('labId', LAB);
  const granted: AssessorGrantDto[] = [];
  fixture.componentInstance.granted.subscribe((g) => granted.push(g));
  await fixture.whenStable();
  const loader = TestbedHarnessEnvironment.loader(fixture);
  const { field, fill, press } = formFields(loader);
  const send = () => press('Grant access');
  return { grant, granted, field, fill, send };
}

describe('GrantForm', () => {
  it('grants access for the period and hands the grant to the list', async () => {
    const { grant, granted, fill, send } = await setup();
    await fill("Assessor's e-mail", 'tove.lindqvist@example.test');
    await fill('From', '2026-01-01');
    await fill('Until', '2026-12-31');
    await send();
    expect(grant).toHaveBeenCalledWith(LAB, {
      email: 'tove.lindqvist@example.test',
      startsOn: '2026-01-01',
      endsOn: '2026-12-31',
    });
    expect(granted).toEqual([saved]);
  });

  it('refuses an end before the start under "Until" without asking the server', async () => {
    const { grant, field, fill, send } = await setup();
    await fill("Assessor's e-mail", 'tove.lindqvist@example.test');
    await fill('From', '2026-05-02');
    await fill('Until', '2026-05-01');
    await send();
    expect(grant).not.toHaveBeenCalled();
    expect(await (await field('Until')).getTextErrors()).toEqual([
      'The access must end on or after its start.',
    ]);
  });

  it("puts the server's rule break that names a field under that field", async () => {
    const refusal = problemResponse(422, 'email: This account is PT provider staff.');
    const { granted, field, fill, send } = await setup(throwError(() => refusal));
    await fill("Assessor's e-mail", 'staff@example.test');
    await fill('From', '2026-01-01');
    await fill('Until', '2026-12-31');
    await send();
    expect(granted).toEqual([]);
    expect(await (await field("Assessor's e-mail")).getTextErrors()).toEqual([
      'This account is PT provider staff.',
    ]);
  });
});
