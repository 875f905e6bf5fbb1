import { HttpErrorResponse } from '@angular/common/http';
import { TestBed } from '@angular/core/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { MAT_DIALOG_DATA, MatDialogRef } from '@angular/material/dialog';
import { MatButtonHarness } from '@angular/material/button/testing';
import { MatFormFieldHarness } from '@angular/material/form-field/testing';
import { MatInputHarness } from '@angular/material/input/testing';
import type { PrecisionAnalysis } from '@ringlet/shared/contracts/precision';
import { of, throwError } from 'rxjs';
import { PrecisionService } from './precision-service';
import { ReferencesDialog, type ReferencesDialogData } from './references-dialog';

describe('ReferencesDialog', () => {
  // Only the parts the dialog reads: two levels of one measurand, level A with a stored reference.
  const analysis = {
    measurands: [
      {
        key: 'z_average',
        label: 'Z-average',
        unit: 'nm',
        levels: [
          { itemCode: 'A', itemLabel: 'A · latex 100 nm' },
          { itemCode: 'B', itemLabel: 'B · latex 200 nm' },
        ],
      },
    ],
    references: [
      { itemCode: 'A', measurandKey: 'z_average', value: 101.5, u: 1.2, source: 'Certificate' },
    ],
  } as unknown as PrecisionAnalysis;
  const data: ReferencesDialogData = { roundId: 'r1', analysis };

  async function setup(answer: ReturnType<PrecisionService['references']>) {
    const close = jest.fn();
    const references = jest.fn().mockReturnValue(answer);
    TestBed.configureTestingModule({
      imports: [ReferencesDialog],
      providers: [
        { provide: MAT_DIALOG_DATA, useValue: data },
        { provide: MatDialogRef, useValue: { close } },
        { provide: PrecisionService, useValue: { references } },
      ],
    });
    const fixture = TestBed.createComponent(ReferencesDialog);
    const loader = TestbedHarnessEnvironment.loader(fixture);
    const save = await loader.getHarness(MatButtonHarness.with({ text: 'Save reference values' }));
    const row = (i: number) =>
      TestbedHarnessEnvironment.loader(fixture).getChildLoader(`[data-testid="reference-${i}"]`);
    return { fixture, loader, close, references, save, row };
  }

  it('fills a level, clears the stored one, and sends the list the contract parses', async () => {
    const { close, references, save, row } = await setup(of(analysis));
    const a = await row(0);
    const b = await row(1);
    expect(await (await a.getHarness(MatInputHarness.with({ placeholder: '' }))).getValue()).toBe(
      '101.5',
    );
    await (await a.getHarness(MatButtonHarness.with({ text: 'Clear' }))).click();
    const [value, , source] = await b.getAllHarnesses(MatInputHarness);
    await value!.setValue('198.3');
    await source!.setValue('  supplier certificate (invented, UI test) ');
    await save.click();
    expect(references).toHaveBeenCalledWith('r1', {
      references: [
        {
          itemCode: 'B',
          measurandKey: 'z_average',
          value: 198.3,
          u: null,
          source: 'supplier certificate (invented, UI test)',
        },
      ],
    });
    expect(close).toHaveBeenCalledWith(analysis);
  });

  it('puts a missing source under the field of its own row, not the first row', async () => {
    const { close, references, save, row } = await setup(of(analysis));
    const b = await row(1);
    await (await b.getAllHarnesses(MatInputHarness))[0]!.setValue('198.3');
    await save.click();
    expect(references).not.toHaveBeenCalled();
    expect(close).not.toHaveBeenCalled();
    const field = await b.getHarness(MatFormFieldHarness.with({ floatingLabelText: 'Source' }));
    expect((await field.getTextErrors()).join(' ')).toContain('Name where the reference value');
    const first = await (
      await row(0)
    ).getHarness(MatFormFieldHarness.with({ floatingLabelText: 'Source' }));
    expect(await first.isControlValid()).toBe(true);
  });

  it("shows the server's refusal next to the button and stays open", async () => {
    const refusal = new HttpErrorResponse({
      status: 409,
      error: { error: { code: 'study_finished', message: 'The study is finished.' } },
    });
    const { fixture, close, save } = await setup(throwError(() => refusal));
    await save.click();
    expect(close).not.toHaveBeenCalled();
    const el = fixture.nativeElement as HTMLElement;
    expect(el.querySelector('[data-testid="references-error"]')?.textContent).toContain(
      'The study is finished.',
    );
  });
});
