import { enrolmentText, ledgerColumns, paymentText, statusText } from './ledger-columns';

describe('the fees ledger cells', () => {
  it('puts an outstanding fee before the status, else a shape and the status word', () => {
    expect(statusText({ status: 'issued', feeOutstanding: true })).toBe('● Fee outstanding');
    expect(statusText({ status: 'paid', feeOutstanding: false })).toBe('✓ Paid');
    expect(statusText({ status: 'credited', feeOutstanding: false })).toBe('↺ Credited');
    expect(statusText({ status: 'issued', feeOutstanding: false })).toBe('↺ Awaiting payment');
  });
  it('says how an invoice was paid, or which credit note cancelled it', () => {
    const none = { paidMethod: null, paidOn: null, paidReference: null, creditNoteNumber: null };
    expect(
      paymentText({
        ...none,
        paidMethod: 'bank-transfer',
        paidOn: '2026-03-02',
        paidReference: 'TR-9',
      }),
    ).toBe('Bank transfer 2026-03-02 TR-9');
    expect(paymentText({ ...none, paidMethod: 'card', paidOn: '2026-03-02' })).toBe(
      'Card 2026-03-02 ',
    );
    expect(paymentText({ ...none, creditNoteNumber: 'CN-1' })).toBe('Credit note CN-1');
    expect(paymentText(none)).toBe('');
  });
  it('says withdrawn before anything about the parcel', () => {
    expect(enrolmentText({ enrolmentState: 'withdrawn', dispatched: true })).toBe('Withdrawn');
    expect(enrolmentText({ enrolmentState: 'enrolled', dispatched: true })).toBe('Dispatched');
    expect(enrolmentText({ enrolmentState: 'enrolled', dispatched: false })).toBe('Enrolled');
  });
  it('formats the total with the money formatter it is given', () => {
    const total = ledgerColumns((minor) => `€${minor / 100}`, []).find(
      (c) => c.field === 'totalMinor',
    )!;
    const format = total.valueFormatter as (p: { value: number }) => string;
    expect(format({ value: 12345 })).toBe('€123.45');
  });
});
