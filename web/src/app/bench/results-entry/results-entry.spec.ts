import { TestBed } from '@angular/core/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { MATERIAL_ANIMATIONS } from '@angular/material/core';
import { MatInputHarness } from '@angular/material/input/testing';
import { MatSelectHarness } from '@angular/material/select/testing';
import type { MyRoundDetail } from '@ringlet/shared/contracts/bench';
import { buildResultsForm } from '../results-form';
import { ResultsEntry, replicatePath } from './results-entry';

const round = {
  items: [
    {
      id: 'i1',
      code: 'A',
      material: 'Latex beads',
      nominalSizeNm: 100,
      storageNotes: '',
      handlingNotes: '',
    },
  ],
  measurands: [
    { id: 'm1', key: 'zavg', name: 'Z-average', unit: 'nm', decimals: 1, replicatesRequired: 3 },
  ],
} as unknown as MyRoundDetail;

async function setup(errors = new Map<string, string>()) {
  TestBed.configureTestingModule({
    imports: [ResultsEntry],
    providers: [{ provide: MATERIAL_ANIMATIONS, useValue: { animationsDisabled: true } }],
  });
  const form = buildResultsForm(
    round.items,
    round.measurands,
    { items: [], acknowledgedWarnings: [], explanation: '' },
    25,
  );
  const fixture = TestBed.createComponent(ResultsEntry);
  fixture.componentRef.setInput('round', round);
  fixture.componentRef.setInput('form', form);
  fixture.componentRef.setInput('errors', errors);
  await fixture.whenStable();
  const loader = TestbedHarnessEnvironment.loader(fixture);
  const el = fixture.nativeElement as HTMLElement;
  return { fixture, loader, form, el };
}

describe('ResultsEntry', () => {
  it('writes replicates, the uncertainty and the conditions into the form', async () => {
    const { loader, form, el } = await setup();
    expect(el.querySelectorAll('[data-testid^="rep-A-zavg-"]')).toHaveLength(3);
    const rep2 = el.querySelector<HTMLInputElement>('[data-testid="rep-A-zavg-2"]')!;
    rep2.value = '101.5';
    rep2.dispatchEvent(new Event('input'));
    expect(form.at(0).controls.results.at(0).controls.replicates.value).toEqual([
      null,
      101.5,
      null,
    ]);

    const kind = await loader.getHarness(
      MatSelectHarness.with({ selector: '[data-testid="ukind-A-zavg"]' }),
    );
    await kind.open();
    await kind.clickOptions({ text: 'Expanded U' });
    expect(form.at(0).controls.results.at(0).controls.uKind.value).toBe('expanded');

    const k = el.querySelector<HTMLInputElement>('[aria-label="A Z-average coverage factor k"]')!;
    expect(k.classList).toContain('narrow-cell');
    k.value = '2';
    k.dispatchEvent(new Event('input'));
    expect(form.at(0).controls.results.at(0).controls.k.value).toBe(2);

    const temperature = await loader.getHarness(
      MatInputHarness.with({ selector: '[data-testid="cond-A-temperatureC"]' }),
    );
    expect(await temperature.getValue()).toBe('25'); // the protocol temperature, prefilled
    const notes = await loader.getHarness(MatInputHarness.with({ selector: 'textarea' }));
    await notes.setValue('Filtered through 0.45 µm.');
    expect(form.at(0).controls.methodNotes.value).toBe('Filtered through 0.45 µm.');
  });

  it('marks a replicate the checks refuse and says why', async () => {
    const { el } = await setup(new Map([[replicatePath(0, 0, 1), 'Must be above 0 nm.']]));
    const rep2 = el.querySelector('[data-testid="rep-A-zavg-2"]')!;
    expect(rep2.classList).toContain('invalid');
    expect(rep2.getAttribute('aria-invalid')).toBe('true');
    expect(el.querySelector('[role="alert"]')?.textContent).toContain('Must be above 0 nm.');
    expect(el.querySelector('[data-testid="rep-A-zavg-1"]')!.classList).not.toContain('invalid');
  });
});
