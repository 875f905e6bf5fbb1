import { TestBed } from '@angular/core/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { MatButtonHarness } from '@angular/material/button/testing';
import { MATERIAL_ANIMATIONS } from '@angular/material/core';
import { MatInputHarness } from '@angular/material/input/testing';
import { MatSelectHarness } from '@angular/material/select/testing';
import type { Exclusion } from '@ringlet/shared/contracts/evaluation';
import { ExclusionForm } from './exclusion-form';

async function setup() {
  TestBed.configureTestingModule({
    imports: [ExclusionForm],
    providers: [{ provide: MATERIAL_ANIMATIONS, useValue: { animationsDisabled: true } }],
  });
  const fixture = TestBed.createComponent(ExclusionForm);
  fixture.componentRef.setInput('view', {
    measurands: [
      { id: 'm1', key: 'z_average', name: 'Z-average' },
      { id: 'm2', key: 'pdi', name: 'PDI' },
    ],
    items: [
      { id: 'i1', code: 'A' },
      { id: 'i2', code: 'B' },
    ],
  });
  fixture.componentRef.setInput('exclusions', []);
  fixture.componentRef.setInput('codes', new Set(['P07']));
  const added: Exclusion[] = [];
  const failed: (string | null)[] = [];
  fixture.componentInstance.added.subscribe((x) => added.push(x));
  fixture.componentInstance.failed.subscribe((m) => failed.push(m));
  await fixture.whenStable();
  const loader = TestbedHarnessEnvironment.loader(fixture);
  const input = (id: string) =>
    loader.getHarness(MatInputHarness.with({ selector: `[data-testid="${id}"]` }));
  const select = (id: string) =>
    loader.getHarness(MatSelectHarness.with({ selector: `[data-testid="${id}"]` }));
  const exclude = () => loader.getHarness(MatButtonHarness.with({ text: 'Exclude' }));
  return { added, failed, input, select, exclude };
}

describe('ExclusionForm', () => {
  it('excludes a known participant on the chosen item and measurand', async () => {
    const { added, failed, input, select, exclude } = await setup();
    await (await input('exclude-code')).setValue(' P07 ');
    const item = await select('exclude-item');
    expect(await item.getValueText()).toBe('A');
    await item.open();
    await item.clickOptions({ text: 'B' });
    const measurand = await select('exclude-measurand');
    await measurand.open();
    await measurand.clickOptions({ text: 'PDI' });
    await (await input('exclude-reason')).setValue('Cuvette cracked during the run');
    await (await exclude()).click();
    expect(failed).toEqual([null]);
    expect(added).toEqual([
      {
        participantCode: 'P07',
        itemCode: 'B',
        measurandKey: 'pdi',
        rule: 'confirmed-blunder',
        reason: 'Cuvette cracked during the run',
      },
    ]);
  });

  it('refuses a participant code without a result in the round', async () => {
    const { added, failed, input, exclude } = await setup();
    await (await input('exclude-code')).setValue('P99');
    await (await input('exclude-reason')).setValue('Not in this round at all');
    await (await exclude()).click();
    expect(added).toEqual([]);
    expect(failed).toEqual(['Participant code: no result from P99 in this round.']);
  });
});
