import type { ColDef } from 'ag-grid-community';
import type { Measurand } from '@ringlet/shared/contracts/rounds';
import { DLS_DEFAULT_MEASURANDS } from '@ringlet/shared/contracts/rounds';
import { assignedRuleText, sigmaRuleText } from '../measurand-rules';

/** A round's measurands as grid columns (without the actions column). */
export const MEASURAND_COLUMNS: ColDef<Measurand>[] = [
  { field: 'name', headerName: 'Measurand', flex: 1, minWidth: 180 },
  { field: 'key', headerName: 'File code', width: 110 },
  {
    field: 'unit',
    headerName: 'Unit',
    width: 80,
    valueFormatter: ({ value }) => (value as string) || '–',
  },
  { field: 'decimals', headerName: 'Decimals', width: 100, type: 'rightAligned' },
  { field: 'replicatesRequired', headerName: 'Replicates', width: 110, type: 'rightAligned' },
  {
    colId: 'sigma',
    headerName: 'σ_pt rule',
    width: 170,
    valueGetter: ({ data }) => (data ? sigmaRuleText(data.sigmaPtRule, data.unit) : ''),
  },
  {
    colId: 'xpt',
    headerName: 'Assigned value',
    flex: 1,
    minWidth: 170,
    valueGetter: ({ data }) => (data ? assignedRuleText(data.assignedValueRule, data.unit) : ''),
  },
  { field: 'minParticipants', headerName: 'Min. participants', width: 150, type: 'rightAligned' },
];

/** Offer the DLS defaults in one click while the round measures neither of them. */
export function lacksDlsDefaults(measurands: readonly Pick<Measurand, 'key'>[]): boolean {
  const keys = new Set(measurands.map((m) => m.key));
  return DLS_DEFAULT_MEASURANDS.every((m) => !keys.has(m.key));
}
