/**
 * The demo's participation fees (invented): the provider charges 20 % tax on the 480.00 EUR
 * fee; every enrolment of the story's rounds has its invoice, dated before enrolment closed.
 * The published rounds are paid (by card or bank transfer); in the round now collecting most
 * labs have paid, a few have not (one was reminded), and one lab that withdrew before dispatch
 * has its invoice credited. Lab 1 (the demo lab manager's lab) still owes the current fee, so
 * "Pay by card" can be tried against the local payment fake.
 */
import type { DataSource } from 'typeorm';
import { audit } from '../../api/src/services/audit';
import { creditOnWithdrawal, issueInvoiceForEnrolment } from '../../api/src/services/billing';
import { Enrolment, Invoice, Organisation, Round, User } from '../entities';

const DAY = 86_400_000;
const isoDate = (d: Date) => d.toISOString().slice(0, 10);

export async function seedDemoBilling(
  ds: DataSource,
  labIds: string[],
  now = new Date(),
): Promise<void> {
  await ds.transaction(async (em) => {
    await em.query('UPDATE provider_profile SET tax_rate_bp = 2000 WHERE id = 1');
    const coordinator = await em.findOne(User, {
      where: { email: 'coordinator@ringlet.example' },
    });
    const rounds = (await em.find(Round)).filter((r) => r.feeMinor > 0 && r.enrolmentClosesOn);
    rounds.sort((a, b) => a.enrolmentClosesOn!.localeCompare(b.enrolmentClosesOn!));
    for (const round of rounds) {
      const issuedAt = new Date(Date.parse(`${round.enrolmentClosesOn}T09:00:00Z`) - 14 * DAY);
      if (issuedAt.getTime() > now.getTime()) continue;
      const current = round.state === 'collecting';
      const enrolments = await em.find(Enrolment, {
        where: { roundId: round.id },
        order: { participantCode: 'ASC' },
      });
      for (const [i, e] of enrolments.entries()) {
        const invoiceId = await issueInvoiceForEnrolment(em, null, e, issuedAt);
        if (!invoiceId) continue;
        const labIndex = labIds.indexOf(e.organisationId);
        if (current && (labIndex === 0 || i % 6 === 2)) {
          if (i % 12 === 2) {
            await em.update(
              Invoice,
              { id: invoiceId },
              { remindersSent: 1, lastRemindedAt: new Date(now.getTime() - 3 * DAY) },
            );
            await audit(
              em,
              coordinator?.id ?? null,
              'invoice.reminder-sent',
              'invoice',
              invoiceId,
              {
                reminder: 1,
              },
            );
          }
          continue;
        }
        const paidOn = new Date(
          Math.min(issuedAt.getTime() + (3 + ((i * 7) % 25)) * DAY, now.getTime()),
        );
        const byCard = i % 3 !== 0;
        const reference = byCard
          ? `pi_demo_${round.code.replace(/\W/g, '')}${String(i + 1).padStart(3, '0')}`
          : `TRF ${round.code} ${String(1000 + i * 37)}`;
        await em.update(
          Invoice,
          { id: invoiceId },
          {
            status: 'paid',
            paidAt: paidOn,
            paidOn: isoDate(paidOn),
            paidMethod: byCard ? 'card' : 'bank-transfer',
            paidReference: reference,
          },
        );
        await audit(
          em,
          byCard ? null : (coordinator?.id ?? null),
          'invoice.paid',
          'invoice',
          invoiceId,
          { method: byCard ? 'card' : 'bank-transfer', reference, paidOn: isoDate(paidOn) },
        );
      }
      if (current) {
        // An invented lab that enrolled, then withdrew before the items went out: credited.
        const name = 'Quarry Lane Nanolab';
        const org =
          (await em.findOne(Organisation, { where: { name } })) ??
          (await em.save(
            Organisation,
            em.create(Organisation, {
              name,
              kind: 'lab',
              country: 'Westvale',
              contactEmail: 'pt-contact@quarry-lane-nanolab.example',
            }),
          ));
        const enrolment = await em.save(
          Enrolment,
          em.create(Enrolment, {
            roundId: round.id,
            organisationId: org.id,
            participantCode: 'PQ7WX',
          }),
        );
        await issueInvoiceForEnrolment(em, null, enrolment, issuedAt);
        const reason = 'Instrument out of service for the round';
        await em.update(
          Enrolment,
          { id: enrolment.id },
          { state: 'withdrawn', withdrawnReason: reason },
        );
        await audit(em, coordinator?.id ?? null, 'enrolment.withdrawn', 'enrolment', enrolment.id, {
          roundId: round.id,
          reason,
        });
        await creditOnWithdrawal(em, coordinator?.id ?? null, enrolment.id, reason);
      }
    }
  });
}
