import type { DataSource } from 'typeorm';
import type { Mailer } from '../mail/mailer';
import { labRecipients } from '../services/lab-recipients';

/** Days before the results-due date at which labs that have not submitted are reminded. */
export const DUE_SOON_DAYS = 3;

export interface ReminderDeps {
  ds: DataSource;
  mailer: Mailer;
  publicUrl: string;
  log: (msg: string, err?: unknown) => void;
}

interface Candidate {
  round_id: string;
  enrolment_id: string;
  organisation_id: string;
  code: string;
  title: string;
  due: Date;
  kind: 'due-soon' | 'overdue';
}

/**
 * Sends "results due in N days" and "overdue" reminders to enrolled labs of collecting rounds
 * that have not submitted (an extension moves a lab's own deadline). Each reminder is claimed
 * by inserting into reminder_log, whose unique (round, enrolment, kind) constraint lets exactly
 * one of several concurrent callers (server instances) send it; a failed send releases the claim
 * so the next run retries. Returns the number of reminders sent.
 */
export async function sendDueReminders(
  deps: ReminderDeps,
  now = new Date(),
  dueSoonDays = DUE_SOON_DAYS,
): Promise<number> {
  const candidates: Candidate[] = await deps.ds.query(
    `SELECT r.id AS round_id, e.id AS enrolment_id, e.organisation_id, r.code, r.title,
            COALESCE(e.extension_until, r.results_due_at) AS due,
            CASE WHEN COALESCE(e.extension_until, r.results_due_at) <= $1 THEN 'overdue' ELSE 'due-soon' END AS kind
     FROM round r
     JOIN enrolment e ON e.round_id = r.id AND e.state = 'enrolled'
     LEFT JOIN submission s ON s.enrolment_id = e.id
     WHERE r.state = 'collecting' AND r.results_due_at IS NOT NULL
       AND COALESCE(s.current_version, 0) = 0
       AND COALESCE(e.extension_until, r.results_due_at) <= $1::timestamptz + make_interval(days => $2)`,
    [now.toISOString(), dueSoonDays],
  );
  let sent = 0;
  for (const c of candidates) {
    const claimed: unknown[] = await deps.ds.query(
      `INSERT INTO reminder_log (round_id, enrolment_id, kind) VALUES ($1, $2, $3)
       ON CONFLICT ON CONSTRAINT reminder_log_once DO NOTHING RETURNING id`,
      [c.round_id, c.enrolment_id, c.kind],
    );
    if (claimed.length === 0) continue; // another instance (or an earlier run) sent it
    const to = await labRecipients(deps.ds.manager, c.organisation_id);
    if (!to.length) continue;
    const due = new Date(c.due).toISOString().replace('T', ' ').slice(0, 16) + ' UTC';
    const [subject, line] =
      c.kind === 'overdue'
        ? [
            `Results for round ${c.code} are overdue`,
            `Your results for round ${c.code} (${c.title}) were due ${due} and have not been submitted.`,
          ]
        : [
            `Results for round ${c.code} are due soon`,
            `Your results for round ${c.code} (${c.title}) are due ${due}.`,
          ];
    try {
      await deps.mailer.send({
        to,
        subject,
        text: `Hello,\n\n${line}\nSubmit them on your Lab bench: ${deps.publicUrl}/bench\n\nIf you need more time, ask the coordinator for an extension.\n\nRinglet`,
      });
      sent++;
    } catch (err) {
      await deps.ds.query(
        `DELETE FROM reminder_log WHERE round_id = $1 AND enrolment_id = $2 AND kind = $3`,
        [c.round_id, c.enrolment_id, c.kind],
      );
      deps.log(`reminder to ${to.join(', ')} failed; the next run retries`, err);
    }
  }
  return sent;
}
