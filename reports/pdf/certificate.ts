/** Certificate of participation (PDF, one landscape page). Participation only, not performance. */
import { recordChecksum, type ParticipantReportInput } from '../model';
import { day, PALETTE } from '../text';
import { artifact, createDoc, figure, finishDoc, write } from './document';
import { docDates, footerText } from './round-report';

export async function buildCertificatePdf(input: ParticipantReportInput): Promise<Buffer> {
  const { doc, done } = createDoc({
    title: `Certificate of participation ${input.round.code} ${input.participantCode}`,
    subject: 'Certificate of participation',
    footer: footerText(input, 'certificate', input.participantCode),
    landscape: true,
    author: input.provider.name,
    ...docDates(input),
  });
  const w = doc.page.width;
  artifact(doc, () => {
    doc
      .rect(30, 30, w - 60, doc.page.height - 80)
      .lineWidth(2)
      .strokeColor(PALETTE.ink, 1)
      .stroke();
    doc
      .rect(38, 38, w - 76, doc.page.height - 96)
      .lineWidth(0.5)
      .strokeColor(PALETTE.teal, 1)
      .stroke();
  });
  const c = { align: 'center' as const, x: 60, width: w - 120 };
  const p = input.provider;
  if (p.logo) {
    figure(doc, `Logo of ${p.name || 'the PT provider'}`, () => {
      try {
        doc.image(p.logo!.data, w / 2 - 60, 46, { fit: [120, 40], align: 'center' });
      } catch {
        // An unreadable logo is left out rather than failing the certificate.
      }
    });
  }
  write(doc, p.name || 'PT provider (name not yet set in the provider profile)', {
    ...c,
    y: 90,
    size: 13,
    bold: true,
    colour: PALETTE.teal,
    gap: 10,
  });
  doc.outline.addItem('Certificate of participation');
  write(doc, 'Certificate of participation', {
    ...c,
    size: 30,
    bold: true,
    colour: PALETTE.ink,
    gap: 18,
    tag: 'H1',
  });
  write(doc, 'This certifies that', { ...c, size: 12, gap: 6 });
  write(doc, input.labName, { ...c, size: 20, bold: true, gap: 6 });
  write(
    doc,
    `took part, with participant code ${input.participantCode}, in round ${input.round.code} (${input.round.title})`,
    { ...c, size: 12, gap: 4 },
  );
  write(doc, `of the scheme ${input.round.schemeName}.`, { ...c, size: 12, gap: 14 });
  const items = input.items.map((i) => i.code).join(', ');
  const measurands = input.measurands.map((m) => m.name).join(', ');
  write(doc, `Test items: ${items}. Measurands: ${measurands}.`, { ...c, size: 10.5, gap: 4 });
  write(
    doc,
    `Evaluation version ${input.evaluation.version}. Issued ${input.evaluation.publishedAt ? day(input.evaluation.publishedAt) : 'not yet (preview)'}; this file made ${day(input.generatedAt)}.`,
    { ...c, size: 10.5, gap: 14 },
  );
  if (input.evaluation.reissueReason)
    write(doc, `Reissued: ${input.evaluation.reissueReason}`, {
      ...c,
      size: 10,
      colour: PALETTE.carmine,
      gap: 8,
    });
  write(
    doc,
    'This certificate confirms participation only; the laboratory’s performance is shown in its individual report.',
    { ...c, size: 9.5, colour: PALETTE.grey, gap: 4 },
  );
  if (p.authoriserName)
    write(
      doc,
      `Authorised by ${p.authoriserName}${p.authoriserRole ? `, ${p.authoriserRole}` : ''}.`,
      { ...c, size: 10, gap: 4 },
    );
  if (p.accreditationNumber)
    write(
      doc,
      `PT provider accredited to ISO/IEC 17043${p.accreditationBody ? ` by ${p.accreditationBody}` : ''}, number ${p.accreditationNumber}.`,
      { ...c, size: 9, colour: PALETTE.grey, gap: 4 },
    );
  write(doc, `Record checksum (SHA-256): ${recordChecksum(input)}`, {
    ...c,
    size: 7.5,
    colour: PALETTE.grey,
  });
  finishDoc(doc);
  return done;
}
