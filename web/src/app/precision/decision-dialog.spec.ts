import { TestBed } from '@angular/core/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { MAT_DIALOG_DATA, MatDialogRef } from '@angular/material/dialog';
import { MatButtonHarness } from '@angular/material/button/testing';
import { MatFormFieldHarness } from '@angular/material/form-field/testing';
import { MatInputHarness } from '@angular/material/input/testing';
import { MatRadioGroupHarness } from '@angular/material/radio/testing';
import { MatSelectHarness } from '@angular/material/select/testing';
import { DecisionDialog, type DecisionDialogData } from './decision-dialog';

describe('DecisionDialog', () => {
  const data: DecisionDialogData = {
    cell: {
      itemCode: 'A',
      itemLabel: 'A · latex 100 nm',
      measurandKey: 'z_average',
      measurandLabel: 'Z-average',
      participantCode: 'L7',
      classification: 'straggler',
      tests: ['cochran'],
      suspectReplicate: 2,
    },
    suspectValue: '104.20 nm',
  };

  async function setup() {
    const close = jest.fn();
    TestBed.configureTestingModule({
      imports: [DecisionDialog],
      providers: [
        { provide: MAT_DIALOG_DATA, useValue: data },
        { provide: MatDialogRef, useValue: { close } },
      ],
    });
    const fixture = TestBed.createComponent(DecisionDialog);
    const loader = TestbedHarnessEnvironment.loader(fixture);
    const reason = await loader.getHarness(
      MatInputHarness.with({ selector: '[data-testid="decision-reason"]' }),
    );
    const submit = await loader.getHarness(MatButtonHarness.with({ text: 'Record decision' }));
    return { fixture, loader, close, reason, submit };
  }

  it('names the cell, its class by word and shape, and the test that flagged it', async () => {
    const { fixture } = await setup();
    const el = fixture.nativeElement as HTMLElement;
    expect(el.querySelector('h2')?.textContent).toContain('Decide on L7');
    expect(el.textContent).toContain("Cochran's C");
    const badge = el.querySelector('[data-class="straggler"]');
    expect(badge?.textContent).toContain('Straggler');
    expect(badge?.querySelector('[data-shape="triangle"]')).not.toBeNull();
  });

  it('refuses to close without a reason', async () => {
    const { loader, close, submit } = await setup();
    await submit.click();
    expect(close).not.toHaveBeenCalled();
    const field = await loader.getHarness(
      MatFormFieldHarness.with({ floatingLabelText: 'Reason' }),
    );
    expect(await field.isControlValid()).toBe(false);
    expect((await field.getTextErrors()).join(' ')).toMatch(/Required|Give a reason/);
  });

  it("sets aside only Cochran's suspect replicate, recorded as a straggler, with the reason", async () => {
    const { loader, close, reason, submit } = await setup();
    const groups = await loader.getAllHarnesses(MatRadioGroupHarness);
    expect(groups).toHaveLength(2);
    await groups[1]!.checkRadioButton({ label: /Only replicate 2 \(104.20 nm\)/ });
    await reason.setValue('  bubble in the cuvette  ');
    await submit.click();
    expect(close).toHaveBeenCalledWith({
      itemCode: 'A',
      measurandKey: 'z_average',
      participantCode: 'L7',
      replicate: 2,
      kind: 'straggler',
      decision: 'confirmed',
      reason: 'bubble in the cuvette',
    });
  });

  it('keeps the cell: no scope question, and the kind can be changed', async () => {
    const { loader, close, reason, submit } = await setup();
    const decision = (await loader.getAllHarnesses(MatRadioGroupHarness))[0]!;
    await decision.checkRadioButton({ label: /Keep/ });
    expect(await loader.getAllHarnesses(MatRadioGroupHarness)).toHaveLength(1);
    const kind = await loader.getHarness(MatSelectHarness);
    await kind.open();
    await kind.clickOptions({ text: 'Other (see reason)' });
    await reason.setValue('the lab confirmed its replicates');
    await submit.click();
    expect(close).toHaveBeenCalledWith(
      expect.objectContaining({ decision: 'rejected', replicate: null, kind: 'other' }),
    );
  });
});
