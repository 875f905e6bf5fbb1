import type { Response } from 'express';
import * as z from 'zod';
import { OutboxMessage } from '../../../shared/contracts/admin';
import { HealthResponse } from '../../../shared/contracts/common';
import { MailMessage } from '../../../db/entities';
import { hasOutbox } from '../config';
import { DATABASE_RETRY_AFTER_SECONDS, notFound } from '../http/errors';
import type { ApiRouter } from '../http/route';
import type { AppContext } from '../services/context';
import { VERSION } from '../version';

/** Liveness answer: the process runs (no database fields: it does not ask the database). */
const LiveResponse = z.object({
  status: z.literal('ok'),
  version: z.string(),
  mode: HealthResponse.shape.mode,
});

export function systemRoutes(api: ApiRouter, ctx: AppContext): void {
  // Readiness: the database answers. 503 (with Retry-After) while it does not, so a load balancer
  // or orchestrator takes this instance out of rotation until the database is back.
  const ready = async (res: Response): Promise<HealthResponse | undefined> => {
    let database: 'up' | 'down' = 'up';
    try {
      await ctx.ds.query('SELECT 1');
    } catch {
      database = 'down';
    }
    const body: HealthResponse = {
      status: database === 'up' ? 'ok' : 'degraded',
      database,
      version: VERSION,
      mode: ctx.config.mode,
    };
    if (database === 'up') return body;
    res.setHeader('Retry-After', String(DATABASE_RETRY_AFTER_SECONDS));
    res.status(503).json(body);
    return undefined;
  };
  for (const path of ['/health', '/health/ready']) {
    api.add({
      method: 'get',
      path,
      tag: 'system',
      summary:
        path === '/health'
          ? 'Whether the server and its database answer (the same as /health/ready)'
          : 'Readiness: whether this instance can serve requests (its database answers)',
      description:
        'Answers 200 with `status: ok` when the database answers, else 503 with `status: degraded`, `database: down` and a Retry-After header.',
      access: 'public',
      response: HealthResponse,
      handler: ({ res }) => ready(res),
    });
  }

  api.add({
    method: 'get',
    path: '/health/live',
    tag: 'system',
    summary: 'Liveness: the server process answers (no database round trip)',
    description:
      'Always 200 while the process runs; restart the instance only when this fails. A database outage shows on /health/ready instead.',
    access: 'public',
    response: LiveResponse,
    handler: () => ({ status: 'ok' as const, version: VERSION, mode: ctx.config.mode }),
  });

  api.add({
    method: 'get',
    path: '/dev/outbox',
    tag: 'system',
    summary:
      'Mail captured by the local mail fake, newest first: mail addressed to me (an admin sees all)',
    description:
      'Each user sees only the messages with their own address among the recipients, so nobody reads another person\u2019s password link or lab mail. An admin sees every message.',
    availability: 'Development, demo and test modes only; 404 in production.',
    access: 'signed-in',
    response: z.array(OutboxMessage),
    handler: async ({ user }) => {
      if (!hasOutbox(ctx.config.mode)) throw notFound('The outbox');
      const q = ctx.ds
        .getRepository(MailMessage)
        .createQueryBuilder('m')
        .orderBy('m.received_at', 'DESC')
        .take(200);
      if (!user.roles.includes('admin')) {
        q.where(
          'EXISTS (SELECT 1 FROM unnest(m.mail_to) AS t(address) WHERE lower(t.address) = lower(:email))',
          { email: user.email },
        );
      }
      const rows = await q.getMany();
      return rows.map((m) => ({ ...m, receivedAt: m.receivedAt.toISOString() }));
    },
  });
}
