import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { TestBed } from '@angular/core/testing';
import { MatButtonHarness } from '@angular/material/button/testing';
import { MATERIAL_ANIMATIONS } from '@angular/material/core';
import { MatSlideToggleHarness } from '@angular/material/slide-toggle/testing';
import { provideRouter } from '@angular/router';
import { aMembership } from '../core/testing';
import { of } from 'rxjs';
import { AdminService } from './admin-service';
import { LabMemberships } from './lab-memberships';

const LAB = '0d7c1f7a-2222-4a2b-8c3d-000000000002';

describe('LabMemberships (admin)', () => {
  it('shows the lab members with a manager switch and Remove, and acts on them', async () => {
    const members = [aMembership(1, true), aMembership(2, false)];
    const calls: string[] = [];
    const admin: Partial<AdminService> = {
      organisations: () => of([]),
      users: () => of([]),
      memberships: () => of(members),
      setManager: (id: string, isManager: boolean) => {
        calls.push(`manager ${id} ${isManager}`);
        return of({ ...members.find((m) => m.id === id)!, isManager });
      },
      removeMembership: (id: string) => {
        calls.push(`remove ${id}`);
        return of(undefined);
      },
    };
    TestBed.configureTestingModule({
      imports: [LabMemberships],
      providers: [
        provideRouter([]),
        { provide: AdminService, useValue: admin },
        { provide: MATERIAL_ANIMATIONS, useValue: { animationsDisabled: true } },
      ],
    });
    const fixture = TestBed.createComponent(LabMemberships);
    fixture.componentRef.setInput('id', LAB);
    await fixture.whenStable();
    const host = fixture.nativeElement as HTMLElement;
    const loader = TestbedHarnessEnvironment.loader(fixture);
    expect(host.querySelector('table')?.getAttribute('aria-label')).toBe('Members');
    const toggles = await loader.getAllHarnesses(MatSlideToggleHarness);
    expect(toggles).toHaveLength(2);
    await toggles[1]!.toggle();
    expect(calls).toEqual([`manager ${members[1]!.id} true`]);
    const removes = await loader.getAllHarnesses(MatButtonHarness.with({ text: 'Remove' }));
    expect(removes).toHaveLength(2);
    await removes[0]!.click();
    expect(calls[1]).toBe(`remove ${members[0]!.id}`);
    await fixture.whenStable();
    expect(host.textContent).not.toContain('member1@example.test');
    expect(host.textContent).toContain('member2@example.test');
  });
});
