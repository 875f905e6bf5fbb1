import express from 'express';
import request from 'supertest';
import { HttpError, errorHandler } from './errors';

describe('errorHandler', () => {
  it('turns an HttpError into the problem body', async () => {
    const app = express();
    app.get('/x', () => {
      throw new HttpError(409, 'draft_conflict', 'Someone else saved first.');
    });
    app.use(errorHandler(() => undefined));
    const res = await request(app).get('/x').expect(409);
    expect(res.body).toEqual({
      error: { code: 'draft_conflict', message: 'Someone else saved first.' },
    });
  });

  it('leaves an answer already on its way to Express instead of setting headers again', async () => {
    const logged: string[] = [];
    const app = express();
    app.get('/stream', (_req, res, next) => {
      res.status(200).setHeader('content-type', 'text/plain');
      res.write('partial');
      next(new HttpError(503, 'database_unavailable', 'later'));
    });
    app.use(errorHandler((msg) => logged.push(msg)));
    // Express ends the connection; without the guard the handler threw ERR_HTTP_HEADERS_SENT.
    const outcome = await request(app)
      .get('/stream')
      .then(
        (r) => r.status,
        (e: Error) => e.message,
      );
    expect([200, 'socket hang up', 'aborted']).toContain(outcome);
    expect(logged).toEqual(['error after the answer was sent']);
  });
});
