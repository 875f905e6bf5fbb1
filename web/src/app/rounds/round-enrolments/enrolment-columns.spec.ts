import { receiptSummary } from './enrolment-columns';

describe('receiptSummary', () => {
  it('counts only enrolled labs, by receipt', () => {
    expect(
      receiptSummary([
        { state: 'enrolled', receiptStatus: 'not-dispatched' },
        { state: 'enrolled', receiptStatus: 'dispatched' },
        { state: 'enrolled', receiptStatus: 'received' },
        { state: 'enrolled', receiptStatus: 'received' },
        { state: 'withdrawn', receiptStatus: 'received-with-problem' },
      ]),
    ).toBe(
      '4 enrolled: 1 not dispatched, 1 in transit, 2 received intact, 0 received with a problem.',
    );
  });
});
