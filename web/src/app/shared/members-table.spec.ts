import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { TestBed } from '@angular/core/testing';
import { MatButtonHarness } from '@angular/material/button/testing';
import { MATERIAL_ANIMATIONS } from '@angular/material/core';
import { MatSlideToggleHarness } from '@angular/material/slide-toggle/testing';
import type { Membership } from '@ringlet/shared/contracts/admin';
import { aMembership } from '../core/testing';
import { type ManagerChange, MembersTable } from './members-table';

const members = [aMembership(1, true), aMembership(2, false)];

async function setup(inputs: Record<string, unknown>) {
  TestBed.configureTestingModule({
    imports: [MembersTable],
    providers: [{ provide: MATERIAL_ANIMATIONS, useValue: { animationsDisabled: true } }],
  });
  const fixture = TestBed.createComponent(MembersTable);
  for (const [k, v] of Object.entries(inputs)) fixture.componentRef.setInput(k, v);
  const removed: Membership[] = [];
  const changes: ManagerChange[] = [];
  fixture.componentInstance.remove.subscribe((m) => removed.push(m));
  fixture.componentInstance.managerChange.subscribe((c) => changes.push(c));
  await fixture.whenStable();
  const host = fixture.nativeElement as HTMLElement;
  return { fixture, host, loader: TestbedHarnessEnvironment.loader(fixture), removed, changes };
}

describe('MembersTable', () => {
  it('names the role in words and offers Remove for everyone but the one kept', async () => {
    const { host, loader, removed } = await setup({
      members,
      label: 'Lab members',
      keep: members[0]!.userId,
    });
    expect(host.querySelector('table')?.getAttribute('aria-label')).toBe('Lab members');
    const headers = Array.from(host.querySelectorAll('th')).map((th) => th.textContent?.trim());
    expect(headers.slice(0, 3)).toEqual(['Name', 'E-mail', 'Role in the lab']);
    expect(host.textContent).toContain('Manager');
    expect(host.textContent).toContain('Member');
    const buttons = await loader.getAllHarnesses(MatButtonHarness.with({ text: 'Remove' }));
    expect(buttons).toHaveLength(1);
    await buttons[0]!.click();
    expect(removed).toEqual([members[1]]);
  });

  it('as a switch asks to change who manages the lab', async () => {
    const { host, loader, changes } = await setup({ members, label: 'Members', manager: 'toggle' });
    const headers = Array.from(host.querySelectorAll('th')).map((th) => th.textContent?.trim());
    expect(headers[2]).toBe('Manager');
    const toggle = (await loader.getAllHarnesses(MatSlideToggleHarness))[1]!;
    expect(await toggle.getAriaLabel()).toBe('Manager: Member 2');
    expect(await toggle.isChecked()).toBe(false);
    await toggle.toggle();
    expect(changes).toEqual([{ membership: members[1], isManager: true }]);
    expect(await loader.getAllHarnesses(MatButtonHarness.with({ text: 'Remove' }))).toHaveLength(2);
  });

  it('says so when the lab has no member, only when asked to', async () => {
    const quiet = await setup({ members: [], label: 'Lab members' });
    expect(quiet.host.querySelector('tbody')?.textContent?.trim() ?? '').toBe('');
    TestBed.resetTestingModule();
    const told = await setup({ members: [], label: 'Members', emptyText: 'No members yet.' });
    expect(told.host.textContent).toContain('No members yet.');
  });
});
