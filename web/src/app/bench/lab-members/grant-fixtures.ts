import type { AssessorGrantDto } from '@ringlet/shared/contracts/evaluation';

/** The lab of the specs' grants (invented). */
export const GRANT_LAB = '0b6a7c1e-2d3f-4a5b-8c9d-0e1f2a3b4c5d';

/** An assessor's grant for specs (invented), active for 2026. */
export function aGrant(overrides: Partial<AssessorGrantDto> = {}): AssessorGrantDto {
  return {
    id: '5c4b3a29-1807-4f6e-9d5c-4b3a29180706',
    organisationId: GRANT_LAB,
    assessorId: '9e8d7c6b-5a49-4382-a716-f5e4d3c2b1a0',
    assessorEmail: 'tove.lindqvist@example.test',
    assessorName: 'Tove Lindqvist',
    startsOn: '2026-01-01',
    endsOn: '2026-12-31',
    revokedAt: null,
    isActive: true,
    createdAt: '2026-01-01T09:00:00.000Z',
    ...overrides,
  };
}
