import { TestBed } from '@angular/core/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { MatButtonHarness } from '@angular/material/button/testing';
import { MATERIAL_ANIMATIONS } from '@angular/material/core';
import { MatInputHarness } from '@angular/material/input/testing';
import { MatSelectHarness } from '@angular/material/select/testing';
import type { SigmaPtOverride } from '@ringlet/shared/contracts/evaluation';
import { SigmaOverrideForm } from './sigma-override-form';

async function setup(overrides: SigmaPtOverride[] = []) {
  TestBed.configureTestingModule({
    imports: [SigmaOverrideForm],
    providers: [{ provide: MATERIAL_ANIMATIONS, useValue: { animationsDisabled: true } }],
  });
  const fixture = TestBed.createComponent(SigmaOverrideForm);
  fixture.componentRef.setInput('view', {
    measurands: [
      { id: 'm1', key: 'z_average', name: 'Z-average' },
      { id: 'm2', key: 'pdi', name: 'PDI' },
    ],
    items: [{ id: 'i1', code: 'A' }],
  });
  fixture.componentRef.setInput('overrides', overrides);
  const added: SigmaPtOverride[] = [];
  const failed: (string | null)[] = [];
  const removed: number[] = [];
  fixture.componentInstance.added.subscribe((o) => added.push(o));
  fixture.componentInstance.failed.subscribe((m) => failed.push(m));
  fixture.componentInstance.removed.subscribe((i) => removed.push(i));
  await fixture.whenStable();
  const loader = TestbedHarnessEnvironment.loader(fixture);
  return { fixture, loader, added, failed, removed };
}

describe('SigmaOverrideForm', () => {
  it('applies 10 % of x_pt to the first measurand on every item', async () => {
    const { loader, added, failed } = await setup();
    const input = (id: string) =>
      loader.getHarness(MatInputHarness.with({ selector: `[data-testid="${id}"]` }));
    await (await input('override-value')).setValue('10');
    await (await input('override-reason')).setValue('fitness for purpose');
    await (await loader.getHarness(MatButtonHarness.with({ text: 'Apply' }))).click();
    expect(failed).toEqual([null]);
    expect(added).toEqual([
      {
        measurandKey: 'z_average',
        itemCode: null,
        rule: { kind: 'percent', percent: 10 },
        reason: 'fitness for purpose',
      },
    ]);
  });

  it('the robust SD needs no value box; a missing reason is refused naming the field', async () => {
    const { loader, added, failed } = await setup();
    const kind = await loader.getHarness(
      MatSelectHarness.with({ selector: '[data-testid="override-kind"]' }),
    );
    await kind.open();
    await kind.clickOptions({ text: 'Robust SD s* of this round' });
    const valueBoxes = await loader.getAllHarnesses(
      MatInputHarness.with({ selector: '[data-testid="override-value"]' }),
    );
    expect(valueBoxes).toHaveLength(0);
    await (await loader.getHarness(MatButtonHarness.with({ text: 'Apply' }))).click();
    expect(added).toEqual([]);
    expect(failed[0]).toMatch(/^Reason: /);
  });

  it('lists the rules set so far, each with a button to take it back', async () => {
    const { loader, removed, fixture } = await setup([
      {
        measurandKey: 'pdi',
        itemCode: 'A',
        rule: { kind: 'fixed', value: 0.02 },
        reason: 'narrow',
      },
    ]);
    expect((fixture.nativeElement as HTMLElement).textContent).toContain('PDI · A:');
    const remove = await loader.getHarness(
      MatButtonHarness.with({ selector: '[aria-label="Remove σ_pt rule for PDI"]' }),
    );
    await remove.click();
    expect(removed).toEqual([0]);
  });
});
