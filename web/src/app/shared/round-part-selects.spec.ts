import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { NonNullableFormBuilder } from '@angular/forms';
import { MatSelectHarness } from '@angular/material/select/testing';
import { ItemSelect, MeasurandSelect, measurandName } from './round-part-selects';

const MEASURANDS = [
  { id: 'm1', key: 'z_average', name: 'Z-average' },
  { id: 'm2', key: 'pdi', name: 'PDI' },
];
const ITEMS = [
  { id: 'i1', code: 'A' },
  { id: 'i2', code: 'B' },
];
import { renderHost } from './form-testing';

@Component({
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MeasurandSelect, ItemSelect],
  template: `
    <app-measurand-select
      [control]="form.controls.measurandKey"
      [measurands]="measurands"
      testId="m"
    />
    <app-item-select [control]="form.controls.itemCode" [items]="items" testId="one" />
    <app-item-select
      [control]="form.controls.anyItem"
      [items]="items"
      [everyItem]="true"
      testId="any"
    />
  `,
})
class Host {
  readonly measurands = MEASURANDS;
  readonly items = ITEMS;
  readonly form = inject(NonNullableFormBuilder).group({
    measurandKey: [''],
    itemCode: [''],
    anyItem: [null as string | null],
  });
}

async function setup() {
  const { fixture, loader } = await renderHost(Host);
  const select = (id: string) =>
    loader.getHarness(MatSelectHarness.with({ selector: `[data-testid="${id}"]` }));
  return { fixture, select };
}

describe('MeasurandSelect and ItemSelect', () => {
  it('pick the first measurand and item while empty; "Every item" stays null', async () => {
    const { fixture, select } = await setup();
    expect(fixture.componentInstance.form.getRawValue()).toEqual({
      measurandKey: 'z_average',
      itemCode: 'A',
      anyItem: null,
    });
    expect(await (await select('m')).getValueText()).toBe('Z-average');
    const any = await select('any');
    await any.open();
    expect(await Promise.all((await any.getOptions()).map((o) => o.getText()))).toEqual([
      'Every item',
      'A',
      'B',
    ]);
  });

  it('set the control to the key or code chosen', async () => {
    const { fixture, select } = await setup();
    const m = await select('m');
    await m.open();
    await m.clickOptions({ text: 'PDI' });
    const one = await select('one');
    await one.open();
    await one.clickOptions({ text: 'B' });
    expect(fixture.componentInstance.form.getRawValue()).toMatchObject({
      measurandKey: 'pdi',
      itemCode: 'B',
    });
  });

  it('names a measurand by its key, or gives the key back', () => {
    expect(measurandName(MEASURANDS, 'pdi')).toBe('PDI');
    expect(measurandName(MEASURANDS, 'gone')).toBe('gone');
  });
});
