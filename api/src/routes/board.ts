import * as z from 'zod';
import { IdParams } from '../../../shared/contracts/common';
import { BoardData, BoardListEntry, BoardQuery } from '../../../shared/contracts/evaluation';
import type { ApiRouter } from '../http/route';
import { boardJson, gzipOf, listBoards } from '../services/board';
import type { AppContext } from '../services/context';

export function boardRoutes(api: ApiRouter, ctx: AppContext): void {
  const readers = ['coordinator', 'lab', 'assessor'] as const;
  api.add({
    method: 'get',
    path: '/boards',
    tag: 'board',
    summary: 'Rounds whose Consensus board I may open',
    access: readers,
    response: z.array(BoardListEntry),
    handler: ({ user }) => listBoards(ctx, user),
  });
  api.add({
    method: 'get',
    path: '/rounds/{id}/board',
    tag: 'board',
    summary: 'Consensus board: one row per participant code, scores per item × measurand',
    description:
      'Coordinators see the newest evaluation and may ask for lab names (reveal=names). A lab sees codes only, its own code listed in ownCodes; ' +
      'an assessor sees codes and the names of the labs that granted access. Labs and assessors see published evaluations only; another round answers 404.',
    access: readers,
    params: IdParams,
    query: BoardQuery,
    response: BoardData,
    handler: async ({ params, query, user, req, res }) => {
      // Written directly: the answer's bytes are kept per evaluation and viewer (services/board.ts),
      // gzip-compressed once for clients that accept it (every browser): a 1,000-participant
      // board is ~0.5 MB of JSON and ~6× less compressed.
      const answer = await boardJson(ctx, user, params.id, query.reveal === 'names');
      const gzip =
        req.get('accept-encoding') !== undefined &&
        req.acceptsEncodings('gzip', 'identity') === 'gzip';
      const bytes = gzip ? await gzipOf(answer) : answer.json;
      res.status(200);
      res.setHeader('Content-Type', 'application/json; charset=utf-8');
      res.setHeader('Vary', 'Accept-Encoding');
      if (gzip) res.setHeader('Content-Encoding', 'gzip');
      res.setHeader('Content-Length', bytes.length);
      res.setHeader('Cache-Control', 'private, no-store');
      res.end(bytes);
    },
  });
}
