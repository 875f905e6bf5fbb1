import type { RoundDetail } from '@ringlet/shared/contracts/rounds';
import { DEFAULT_INSTRUCTIONS } from '@ringlet/shared/contracts/safety';

/** A round for the round dialogs' specs (invented demo values). */
export function aRound(overrides: Partial<RoundDetail> = {}): RoundDetail {
  return {
    id: '3e2a9c1f-7b4d-4a8e-9c5f-1d0b6a8e2f71',
    schemeId: '0b8f4d7e-5c1a-4e9b-8f3d-2a6c9e1b7d40',
    schemeCode: 'NANO-DLS',
    code: 'DLS-2026-1',
    title: 'Latex and silica, spring 2026',
    kind: 'pt',
    state: 'draft',
    enrolmentClosesOn: '2026-04-30',
    dispatchOn: '2026-05-10',
    resultsDueAt: '2026-06-30T10:00:00.000Z',
    feeMinor: 35000,
    currency: 'EUR',
    itemCount: 0,
    enrolledCount: 0,
    createdAt: '2026-03-01T09:00:00.000Z',
    instructions: DEFAULT_INSTRUCTIONS,
    protocolTemperatureC: 25,
    items: [],
    measurands: [],
    transitions: [],
    hasOpenHomogeneityFailure: false,
    ...overrides,
  };
}
