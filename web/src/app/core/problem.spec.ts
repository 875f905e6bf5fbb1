import { HttpErrorResponse } from '@angular/common/http';
import { fieldLabel, problemMessage, readable } from './problem';

describe('field paths become labels (docs/GLOSSARY.md: no field paths on screens)', () => {
  it('names a field by its label, indices as positions', () => {
    expect(fieldLabel('participantCode')).toBe('Participant code');
    expect(fieldLabel('runs.1.pdi')).toBe('Replicate 2, PDI');
    expect(fieldLabel('items.0.results.1.replicates.2')).toBe('Item 1, Measurand 2, Replicate 3');
    expect(fieldLabel('resultsDueAt')).toBe('Results due');
  });

  it('rewrites a server message that opens with a field path', () => {
    expect(readable('participantCode: no result from P01 in this round.')).toBe(
      'Participant code: no result from P01 in this round.',
    );
    expect(readable('Results are locked.')).toBe('Results are locked.');
    const err = new HttpErrorResponse({
      status: 409,
      error: {
        error: {
          code: 'fee_locked',
          message: 'feeMinor: the participation fee is fixed once enrolment has opened.',
        },
      },
    });
    expect(problemMessage(err)).toBe(
      'Fee: the participation fee is fixed once enrolment has opened.',
    );
  });
});
