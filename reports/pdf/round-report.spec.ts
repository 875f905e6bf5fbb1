import { syntheticParticipantInput, syntheticReportInput } from '../testing/synthetic-input';
import { recordChecksum } from '../model';
import { buildParticipantReportPdf, position } from './participant-report';
import { buildRoundReportPdf } from './round-report';
// eslint-disable-next-line @typescript-eslint/no-require-imports
const pdfParse = require('pdf-parse') as (b: Buffer) => Promise<{ text: string; numpages: number }>;

describe('round report PDF', () => {
  it('holds every assigned value, σ_pt and code, the reissue reason and the record checksum', async () => {
    const input = syntheticReportInput({
      participants: 25,
      blunders: [4],
      reissueReason: 'corrected σ_pt of item B',
    });
    const text = (await pdfParse(await buildRoundReportPdf(input))).text.replace(/\s+/g, ' ');
    for (const g of input.groups) {
      expect(text).toContain(`x_pt = ${g.assignedValue!.toFixed(g.decimals + 1)}`);
      expect(text).toContain(`σ_pt = ${g.sigmaPt!.toFixed(g.decimals + 1)}`);
    }
    for (const p of input.groups[0]!.participants) expect(text).toContain(p.code);
    expect(text).toContain(
      'Corrected report: evaluation version 2 replaces version 1. Reason: corrected σ_pt of item B',
    );
    expect(text).toContain(recordChecksum(input).slice(0, 16)); // footer
    expect(text).toMatch(/ISO 13528:2015/);
    expect(text).toMatch(/radius may have been reported as a diameter/); // blunder hint in general words
  });

  it('gives a lab its own rank in the distribution', async () => {
    const input = syntheticParticipantInput({ participants: 10, blunders: [0] }, 0);
    const g = input.groups[0]!;
    // The doubled Z-average is the largest of the ten results: rank 10 of 10, all 9 others lower.
    expect(position(g, input.participantCode)).toEqual({ rank: 10, of: 10, percentBelow: 100 });
    const text = (await pdfParse(await buildParticipantReportPdf(input))).text.replace(/\s+/g, ' ');
    expect(text).toContain('your result is number 10 of 10 from the lowest');
    expect(text).toContain('Track record');
  });
});
