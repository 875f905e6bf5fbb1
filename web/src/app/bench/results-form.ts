import { FormArray, FormControl, FormGroup } from '@angular/forms';
import type { BenchItem, BenchMeasurand } from '@ringlet/shared/contracts/bench';
import type { MeasurementConditions, SubmissionData } from '@ringlet/shared/contracts/submission';

type Num = FormControl<number | null>;
type Text = FormControl<string>;

export type ResultRow = FormGroup<{
  replicates: FormArray<Num>;
  uKind: FormControl<'none' | 'standard' | 'expanded'>;
  uValue: Num;
  k: Num;
}>;
export type ConditionsGroup = FormGroup<{
  instrument: Text;
  laserWavelengthNm: Num;
  scatteringAngleDeg: Num;
  temperatureC: Num;
  equilibrationMin: Num;
  dispersant: Text;
  viscosityMPas: Num;
  refractiveIndex: Num;
  dilution: Text;
  filterPoreUm: Num;
  cuvette: Text;
}>;
export type ItemGroup = FormGroup<{
  results: FormArray<ResultRow>;
  conditions: ConditionsGroup;
  methodNotes: Text;
}>;
export type ResultsForm = FormArray<ItemGroup>;

const num = (v: number | null = null) => new FormControl<number | null>(v);
const text = (v = '') => new FormControl<string>(v, { nonNullable: true });

/** One form group per item × measurand, prefilled from a draft (items and measurands in the round's order). */
export function buildResultsForm(
  items: BenchItem[],
  measurands: BenchMeasurand[],
  draft: SubmissionData,
  protocolTemperatureC: number,
): ResultsForm {
  return new FormArray(
    items.map((item) => {
      const d = draft.items.find((x) => x.testItemId === item.id);
      const c: Partial<MeasurementConditions> = d?.conditions ?? {
        temperatureC: protocolTemperatureC,
        dispersant: 'water',
      };
      return new FormGroup({
        results: new FormArray(
          measurands.map((m) => {
            const r = d?.results.find((x) => x.measurandId === m.id);
            return new FormGroup({
              replicates: new FormArray(
                Array.from({ length: m.replicatesRequired }, (_, k) =>
                  num(r?.replicates[k] ?? null),
                ),
              ),
              uKind: new FormControl<'none' | 'standard' | 'expanded'>(
                r?.uncertainty?.kind ?? 'none',
                { nonNullable: true },
              ),
              uValue: num(r?.uncertainty?.value ?? null),
              k: num(r?.uncertainty?.k ?? null),
            });
          }),
        ),
        conditions: new FormGroup({
          instrument: text(c.instrument ?? ''),
          laserWavelengthNm: num(c.laserWavelengthNm ?? null),
          scatteringAngleDeg: num(c.scatteringAngleDeg ?? null),
          temperatureC: num(c.temperatureC ?? null),
          equilibrationMin: num(c.equilibrationMin ?? null),
          dispersant: text(c.dispersant ?? 'water'),
          viscosityMPas: num(c.viscosityMPas ?? null),
          refractiveIndex: num(c.refractiveIndex ?? null),
          dilution: text(c.dilution ?? ''),
          filterPoreUm: num(c.filterPoreUm ?? null),
          cuvette: text(c.cuvette ?? ''),
        }),
        methodNotes: text(d?.methodNotes ?? ''),
      });
    }),
  );
}

const finiteOrNull = (v: number | null | undefined) =>
  typeof v === 'number' && Number.isFinite(v) ? v : null;

/** The form as SubmissionData (the shape the server validates again). */
export function resultsFromForm(
  form: ResultsForm,
  items: BenchItem[],
  measurands: BenchMeasurand[],
  acknowledgedWarnings: string[],
  explanation: string,
): SubmissionData {
  return {
    items: form.controls.map((g, ii) => {
      const v = g.getRawValue();
      return {
        testItemId: items[ii]!.id,
        results: v.results.map((r, mi) => ({
          measurandId: measurands[mi]!.id,
          replicates: r.replicates.map(finiteOrNull),
          uncertainty:
            r.uKind === 'none' || finiteOrNull(r.uValue) === null || (r.uValue ?? 0) <= 0
              ? null
              : {
                  kind: r.uKind,
                  value: r.uValue!,
                  k: r.uKind === 'expanded' ? (finiteOrNull(r.k) ?? 2) : null,
                },
        })),
        conditions: {
          ...v.conditions,
          laserWavelengthNm: finiteOrNull(v.conditions.laserWavelengthNm),
          scatteringAngleDeg: finiteOrNull(v.conditions.scatteringAngleDeg),
          temperatureC: finiteOrNull(v.conditions.temperatureC),
          equilibrationMin: finiteOrNull(v.conditions.equilibrationMin),
          viscosityMPas: finiteOrNull(v.conditions.viscosityMPas),
          refractiveIndex: finiteOrNull(v.conditions.refractiveIndex),
          filterPoreUm: finiteOrNull(v.conditions.filterPoreUm),
        },
        methodNotes: v.methodNotes,
      };
    }),
    acknowledgedWarnings,
    explanation,
  };
}

/** The condition fields, labelled with their units, in tab order. */
export const CONDITION_FIELDS: {
  key: keyof MeasurementConditions;
  label: string;
  numeric: boolean;
}[] = [
  { key: 'instrument', label: 'Instrument', numeric: false },
  { key: 'laserWavelengthNm', label: 'Laser wavelength (nm)', numeric: true },
  { key: 'scatteringAngleDeg', label: 'Scattering angle (°)', numeric: true },
  { key: 'temperatureC', label: 'Temperature (°C)', numeric: true },
  { key: 'equilibrationMin', label: 'Equilibration (min)', numeric: true },
  { key: 'dispersant', label: 'Dispersant', numeric: false },
  { key: 'viscosityMPas', label: 'Viscosity (mPa·s)', numeric: true },
  { key: 'refractiveIndex', label: 'Refractive index', numeric: true },
  { key: 'dilution', label: 'Dilution', numeric: false },
  { key: 'filterPoreUm', label: 'Filter pore size (µm)', numeric: true },
  { key: 'cuvette', label: 'Cuvette', numeric: false },
];
