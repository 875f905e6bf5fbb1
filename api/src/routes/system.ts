import * as z from 'zod';
import { OutboxMessage } from '../../../shared/contracts/admin';
import { HealthResponse } from '../../../shared/contracts/common';
import { MailMessage } from '../../../db/entities';
import { hasOutbox } from '../config';
import { notFound } from '../http/errors';
import type { ApiRouter } from '../http/route';
import type { AppContext } from '../services/context';
import { VERSION } from '../version';

export function systemRoutes(api: ApiRouter, ctx: AppContext): void {
  api.add({
    method: 'get',
    path: '/health',
    tag: 'system',
    summary: 'Whether the server and its database answer',
    access: 'public',
    response: HealthResponse,
    handler: async ({ res }) => {
      let database: 'up' | 'down' = 'up';
      try {
        await ctx.ds.query('SELECT 1');
      } catch {
        database = 'down';
      }
      res.status(database === 'up' ? 200 : 503);
      return { status: database === 'up' ? 'ok' : 'degraded', database, version: VERSION, mode: ctx.config.mode };
    },
  });

  api.add({
    method: 'get',
    path: '/dev/outbox',
    tag: 'system',
    summary: 'Mail captured by the local mail fake, newest first: mail addressed to me (an admin sees all)',
    description:
      'Each user sees only the messages with their own address among the recipients, so nobody reads another person\u2019s password link or lab mail. An admin sees every message.',
    availability: 'Development, demo and test modes only; 404 in production.',
    access: 'signed-in',
    response: z.array(OutboxMessage),
    handler: async ({ user }) => {
      if (!hasOutbox(ctx.config.mode)) throw notFound('The outbox');
      const q = ctx.ds.getRepository(MailMessage).createQueryBuilder('m').orderBy('m.received_at', 'DESC').take(200);
      if (!user.roles.includes('admin')) {
        q.where('EXISTS (SELECT 1 FROM unnest(m.mail_to) AS t(address) WHERE lower(t.address) = lower(:email))', { email: user.email });
      }
      const rows = await q.getMany();
      return rows.map((m) => ({ ...m, receivedAt: m.receivedAt.toISOString() }));
    },
  });
}
