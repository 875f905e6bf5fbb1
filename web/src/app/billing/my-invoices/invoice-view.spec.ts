import type { Me } from '@ringlet/shared/contracts/auth';
import { managesActingLab, pdfLabel } from './invoice-view';

type Membership = Me['memberships'][number];
const member = (organisationId: string, isManager: boolean) =>
  ({ organisationId, isManager }) as Membership;

describe('managesActingLab', () => {
  it('is false when nobody is signed in or the person belongs to no lab', () => {
    expect(managesActingLab(null)).toBe(false);
    expect(managesActingLab({ actingLabId: null, memberships: [] })).toBe(false);
  });
  it('asks about the chosen lab, not any lab the person manages', () => {
    const memberships = [member('lab-a', true), member('lab-b', false)];
    expect(managesActingLab({ actingLabId: 'lab-a', memberships })).toBe(true);
    expect(managesActingLab({ actingLabId: 'lab-b', memberships })).toBe(false);
  });
  it('without a chosen lab, asks about the first lab', () => {
    expect(
      managesActingLab({
        actingLabId: null,
        memberships: [member('lab-b', false), member('lab-a', true)],
      }),
    ).toBe(false);
    expect(managesActingLab({ actingLabId: null, memberships: [member('lab-a', true)] })).toBe(
      true,
    );
  });
});

describe('pdfLabel', () => {
  it('calls a paid invoice a receipt', () => {
    expect(pdfLabel('paid')).toBe('Receipt (PDF)');
    expect(pdfLabel('issued')).toBe('Invoice (PDF)');
    expect(pdfLabel('credited')).toBe('Invoice (PDF)');
  });
});
