import type { EntityManager } from 'typeorm';
import type { OutgoingMail } from '../mail/mailer';
import type { AppContext } from '../services/context';

/**
 * The publication mail fan-out. With a job queue (the server), one `publication-mail` job per lab
 * is inserted in the publication's own transaction (`em`): the mail exists exactly when the
 * publication committed, survives a restart and is retried with back-off (MAIL_RETRY). Call the
 * returned function after the commit: it wakes this instance's worker. Without a queue (tests and
 * benches that start the app alone) the returned function sends from this process, 8 at a time,
 * without holding the request.
 */
export async function enqueuePublicationMails(
  ctx: AppContext,
  em: EntityManager,
  mails: OutgoingMail[],
): Promise<() => void> {
  const queue = ctx.queue;
  if (queue) {
    await queue.enqueueMails(mails, em);
    return () => queue.kick();
  }
  return () => {
    let next = 0;
    const worker = async () => {
      while (next < mails.length) {
        const m = mails[next++]!;
        try {
          await ctx.mailer.send(m);
        } catch (err) {
          ctx.log(`publication mail to ${String(m.to)} failed`, err);
        }
      }
    };
    void Promise.all(Array.from({ length: Math.min(8, mails.length) }, worker));
  };
}
