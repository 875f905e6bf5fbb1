import { TestBed } from '@angular/core/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { MatButtonHarness } from '@angular/material/button/testing';
import { MATERIAL_ANIMATIONS } from '@angular/material/core';
import { MatInputHarness } from '@angular/material/input/testing';
import { MatSelectHarness } from '@angular/material/select/testing';
import { of } from 'rxjs';
import type { MyRoundDetail } from '@ringlet/shared/contracts/bench';
import { DAMAGED_PARCEL_CAUTIONS } from '@ringlet/shared/contracts/safety';
import { BenchService } from '../bench-service';
import { BenchReceipt } from './bench-receipt';

const round = { roundId: 'r1', receipt: null, items: [] } as unknown as MyRoundDetail;

async function setup() {
  const saveReceipt = jest.fn(() =>
    of({ ...round, receipt: { receivedOn: '2026-03-02', condition: 'leaked' } }),
  );
  TestBed.configureTestingModule({
    imports: [BenchReceipt],
    providers: [
      { provide: MATERIAL_ANIMATIONS, useValue: { animationsDisabled: true } },
      { provide: BenchService, useValue: { saveReceipt } },
    ],
  });
  const fixture = TestBed.createComponent(BenchReceipt);
  fixture.componentRef.setInput('round', round);
  const saved: MyRoundDetail[] = [];
  fixture.componentInstance.saved.subscribe((r) => saved.push(r));
  await fixture.whenStable();
  const loader = TestbedHarnessEnvironment.loader(fixture);
  return { fixture, loader, saveReceipt, saved };
}

describe('BenchReceipt', () => {
  it('shows the damaged-parcel cautions once Leaked is chosen, and records the receipt', async () => {
    const { fixture, loader, saveReceipt, saved } = await setup();
    const text = () => (fixture.nativeElement as HTMLElement).textContent ?? '';
    expect(text()).not.toContain(DAMAGED_PARCEL_CAUTIONS[0]);

    const condition = await loader.getHarness(MatSelectHarness);
    await condition.open();
    await condition.clickOptions({ text: 'Leaked' });
    expect(text()).toContain(DAMAGED_PARCEL_CAUTIONS[0]);

    const inputs = await loader.getAllHarnesses(MatInputHarness);
    await inputs[0]!.setValue('2026-03-02');
    await (await loader.getHarness(MatButtonHarness.with({ text: 'Record receipt' }))).click();
    await fixture.whenStable();
    expect(saveReceipt).toHaveBeenCalledWith(
      'r1',
      { receivedOn: '2026-03-02', condition: 'leaked', notes: '' },
      null,
    );
    expect(saved).toHaveLength(1);
    expect(text()).toContain('Receipt recorded.');
  });
});
