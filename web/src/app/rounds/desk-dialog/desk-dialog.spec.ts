import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { MATERIAL_ANIMATIONS } from '@angular/material/core';
import { MatButtonHarness } from '@angular/material/button/testing';
import { MatDialog } from '@angular/material/dialog';
import { MatDialogHarness } from '@angular/material/dialog/testing';
import { MatInputHarness } from '@angular/material/input/testing';
import { of } from 'rxjs';
import type { Withdrawal, TransitionRequest } from '@ringlet/shared/contracts/rounds';
import { settle } from '../../core/testing';
import { openDeskDialog } from './desk-dialog';
import { type DeskDialogData, deskConfirmLabel, deskFields } from './desk-dialog-data';

@Component({ selector: 'app-host', template: '', changeDetection: ChangeDetectionStrategy.OnPush })
class Host {
  readonly dialog = inject(MatDialog);
}

async function open<R>(data: DeskDialogData<R>) {
  TestBed.configureTestingModule({
    imports: [Host],
    providers: [{ provide: MATERIAL_ANIMATIONS, useValue: { animationsDisabled: true } }],
  });
  const fixture = TestBed.createComponent(Host);
  const after = jest.fn();
  openDeskDialog(fixture.componentInstance.dialog, data, after);
  const loader = TestbedHarnessEnvironment.documentRootLoader(fixture);
  const dialog = await loader.getHarness(MatDialogHarness);
  return { fixture, dialog, after };
}

describe('DeskDialog', () => {
  afterEach(() => document.body.replaceChildren());

  it('withdrawal: asks for a reason, refuses a short one, sends the parsed value', async () => {
    const send = jest.fn((v: Withdrawal) => of({ id: 'e1', reason: v.reason }));
    const { fixture, dialog, after } = await open({
      kind: 'withdrawal',
      title: 'Withdraw P01',
      send,
    });
    expect(await dialog.getTitleText()).toBe('Withdraw P01');
    const reason = await dialog.getHarness(MatInputHarness.with({ selector: 'textarea' }));
    const confirm = await dialog.getHarness(MatButtonHarness.with({ text: 'Confirm' }));

    await reason.setValue('no');
    await confirm.click();
    expect(send).not.toHaveBeenCalled();
    expect(await dialog.getText()).toContain('at least 5 characters');

    await reason.setValue('The lab closed its DLS laboratory.');
    await confirm.click();
    await settle();
    await fixture.whenStable();
    expect(send).toHaveBeenCalledWith({ reason: 'The lab closed its DLS laboratory.' });
    expect(after).toHaveBeenCalledWith({ id: 'e1', reason: 'The lab closed its DLS laboratory.' });
  });

  it('transition: the move is the button, the reason optional, the target state sent', async () => {
    const send = jest.fn((v: TransitionRequest) => of(v));
    const { dialog } = await open({
      kind: 'transition',
      title: 'Move R-1 to Enrolling',
      to: 'enrolling',
      moveLabel: 'Open enrolment',
      whoIsTold: 'Nobody',
      offerForce: false,
      reasonRequired: false,
      send,
    });
    expect(await dialog.getText()).toContain('Reason (optional)');
    expect(await dialog.getText()).toContain('Who is told: Nobody');
    await (await dialog.getHarness(MatButtonHarness.with({ text: 'Open enrolment' }))).click();
    await settle();
    expect(send).toHaveBeenCalledWith({ to: 'enrolling', force: false });
  });

  it('confirm: no fields, the given label, send without a value', async () => {
    const send = jest.fn(() => of(true as const));
    const { fixture, dialog, after } = await open({
      kind: 'confirm',
      title: 'Remove test item C?',
      confirmLabel: 'Remove item C',
      send,
    });
    expect(await dialog.getAllHarnesses(MatInputHarness)).toHaveLength(0);
    await (await dialog.getHarness(MatButtonHarness.with({ text: 'Remove item C' }))).click();
    await settle();
    await fixture.whenStable();
    expect(send).toHaveBeenCalledWith();
    expect(after).toHaveBeenCalledWith(true);
  });
});

describe('deskConfirmLabel and deskFields', () => {
  const none = () => of(null);
  it('names the button after the move, the removal, or Confirm', () => {
    expect(
      deskConfirmLabel({
        kind: 'transition',
        title: '',
        to: 'closed',
        offerForce: true,
        reasonRequired: true,
        send: none,
      }),
    ).toBe('Move to Closed');
    expect(
      deskConfirmLabel({ kind: 'confirm', title: '', confirmLabel: 'Remove PDI', send: none }),
    ).toBe('Remove PDI');
    expect(deskConfirmLabel({ kind: 'extension', title: '', send: none })).toBe('Confirm');
  });
  it('shows the reason everywhere but dispatch and confirm; optional only on a free move', () => {
    expect(deskFields({ kind: 'dispatch', title: '', cautions: [], send: none }).reason).toBe(
      false,
    );
    expect(deskFields({ kind: 'decision', title: '', send: none })).toMatchObject({
      reason: true,
      reasonOptional: false,
      decision: true,
    });
    const early = deskFields({
      kind: 'transition',
      title: '',
      to: 'closed',
      offerForce: true,
      reasonRequired: true,
      send: none,
    });
    expect(early).toMatchObject({ reason: true, reasonOptional: false, force: true });
  });
});
