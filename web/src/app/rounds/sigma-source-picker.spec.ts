import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { MATERIAL_ANIMATIONS } from '@angular/material/core';
import { MatButtonHarness } from '@angular/material/button/testing';
import { MatDialog } from '@angular/material/dialog';
import { MatDialogHarness } from '@angular/material/dialog/testing';
import { MatFormFieldHarness } from '@angular/material/form-field/testing';
import type { MatInputHarness } from '@angular/material/input/testing';
import { MatSelectHarness } from '@angular/material/select/testing';
import { of } from 'rxjs';
import type { PrecisionSigmaSources } from '@ringlet/shared/contracts/precision';
import type { Measurand, MeasurandUpdate } from '@ringlet/shared/contracts/rounds';
import { settle } from '../core/testing';
import { MeasurandDialog, type MeasurandDialogData } from './measurand-dialog/measurand-dialog';
import { RoundsService } from './rounds-service';
import { sigmaSourceChoices } from './sigma-source-picker';

// Invented demo values: the picker only carries the server's numbers over, it computes nothing.
const SCHEME = '0b8f4d7e-5c1a-4e9b-8f3d-2a6c9e1b7d40';
const ROUND = '3e2a9c1f-7b4d-4a8e-9c5f-1d0b6a8e2f71';
const STUDY = '9a7c5e3b-1d2f-4b6a-8e0c-4f2a6b8d1c93';
const level = (itemCode: string, sR: number | null, sr: number | null) => ({
  itemCode,
  itemLabel: `Level ${itemCode}`,
  mean: 100,
  sr,
  sR,
  p: 9,
});
const SOURCES: PrecisionSigmaSources = {
  studies: [
    {
      roundId: STUDY,
      roundCode: 'PS-2026-1',
      title: 'Latex 100 nm precision study',
      state: 'evaluated',
      measurands: [
        {
          key: 'z_average',
          label: 'Z-average',
          unit: 'nm',
          levels: [level('A', 2.5, 0.8), level('B', 3.1, 1.1), level('C', null, null)],
        },
        { key: 'pdi', label: 'PdI', unit: '', levels: [level('A', 0.02, 0.01)] },
      ],
    },
  ],
};
const MEASURAND: Measurand = {
  id: '5d1e8b2c-6a3f-4c7d-9e1b-0f4a2c6e8b15',
  roundId: ROUND,
  key: 'z_average',
  name: 'Z-average',
  unit: 'nm',
  decimals: 1,
  replicatesRequired: 3,
  sigmaPtRule: { kind: 'precision', sigmaR: 4, source: 'Earlier study' },
  assignedValueRule: { kind: 'consensus' },
  minParticipants: 12,
  position: 0,
};

@Component({ selector: 'app-host', template: '', changeDetection: ChangeDetectionStrategy.OnPush })
class Host {
  readonly dialog = inject(MatDialog);
}

async function open(sources: PrecisionSigmaSources) {
  const updateMeasurand = jest.fn((_r: string, _m: string, body: MeasurandUpdate) =>
    of({ ...MEASURAND, ...body }),
  );
  const precisionSources = jest.fn(() => of(sources));
  TestBed.configureTestingModule({
    imports: [Host],
    providers: [
      { provide: MATERIAL_ANIMATIONS, useValue: { animationsDisabled: true } },
      { provide: RoundsService, useValue: { updateMeasurand, precisionSources } },
    ],
  });
  const fixture = TestBed.createComponent(Host);
  const data: MeasurandDialogData = { roundId: ROUND, schemeId: SCHEME, measurand: MEASURAND };
  fixture.componentInstance.dialog.open(MeasurandDialog, { data });
  const loader = TestbedHarnessEnvironment.documentRootLoader(fixture);
  const dialog = await loader.getHarness(MatDialogHarness);
  const sigmaField = await dialog.getHarness(
    MatFormFieldHarness.with({ floatingLabelText: /σ_R/ }),
  );
  const save = async () => {
    await (await dialog.getHarness(MatButtonHarness.with({ text: 'Save measurand' }))).click();
    await settle();
    await fixture.whenStable();
  };
  return { dialog, sigmaField, save, updateMeasurand, precisionSources };
}

describe('SigmaSourcePicker in the measurand dialog', () => {
  afterEach(() => document.body.replaceChildren());

  it('lists the matching measurand’s levels; the chosen one fills σ_R, σ_r, m and the study link', async () => {
    const { dialog, sigmaField, save, updateMeasurand, precisionSources } = await open(SOURCES);
    expect(precisionSources).toHaveBeenCalledWith(SCHEME);
    const select = await dialog.getHarness(
      MatSelectHarness.with({ selector: '[data-testid="sigma-source"]' }),
    );
    await select.open();
    const options = await select.getOptions();
    // level C has no s_R; PdI is another measurand
    expect(await Promise.all(options.map((o) => o.getText()))).toEqual([
      'PS-2026-1 · Level A · Z-average · s_R 2.5 nm',
      'PS-2026-1 · Level B · Z-average · s_R 3.1 nm',
    ]);
    await select.clickOptions({ text: /Level B/ });

    const sigmaR = (await sigmaField.getControl()) as MatInputHarness;
    expect(await sigmaR.getValue()).toBe('3.1');
    expect(await sigmaField.getTextHints()).toEqual(['from precision study PS-2026-1']);

    await save();
    expect(updateMeasurand).toHaveBeenCalledTimes(1);
    expect(updateMeasurand.mock.calls[0][2].sigmaPtRule).toEqual({
      kind: 'precision',
      sigmaR: 3.1,
      sigmaRepeatability: 1.1,
      replicates: 3,
      source: 'Earlier study',
      study: { roundId: STUDY, roundCode: 'PS-2026-1' },
    });
  });

  it('editing σ_R by hand after taking a study drops the study link', async () => {
    const { dialog, sigmaField, save, updateMeasurand } = await open(SOURCES);
    await (
      await dialog.getHarness(MatSelectHarness.with({ selector: '[data-testid="sigma-source"]' }))
    ).clickOptions({ text: /Level A/ });
    expect(await sigmaField.getTextHints()).toEqual(['from precision study PS-2026-1']);

    await ((await sigmaField.getControl()) as MatInputHarness).setValue('2.7');
    expect(await sigmaField.getTextHints()).toEqual([]);
    await save();
    const rule = updateMeasurand.mock.calls[0][2].sigmaPtRule;
    expect(rule).toMatchObject({ kind: 'precision', sigmaR: 2.7 });
    expect(rule).not.toHaveProperty('study');
  });

  it('says in one line when the scheme has no finished precision study', async () => {
    const { dialog } = await open({ studies: [] });
    const selects = await dialog.getAllHarnesses(
      MatSelectHarness.with({ selector: '[data-testid="sigma-source"]' }),
    );
    expect(selects).toHaveLength(0);
    expect(await dialog.getText()).toContain('No finished precision study');
  });
});

describe('sigmaSourceChoices', () => {
  it('shows every measurand’s levels when none has the dialog’s file code', () => {
    expect(sigmaSourceChoices(SOURCES, 'd10').map((c) => c.measurandKey)).toEqual([
      'z_average',
      'z_average',
      'pdi',
    ]);
  });
});
