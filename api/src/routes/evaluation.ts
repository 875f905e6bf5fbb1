import { IdParams } from '../../../shared/contracts/common';
import {
  EvaluationRequest,
  EvaluationView,
  LabQuery,
  LabScores,
  PublishResponse,
  ReissueRequest,
  TrackRecord,
} from '../../../shared/contracts/evaluation';
import type { ApiRouter } from '../http/route';
import type { AppContext } from '../services/context';
import * as evaluation from '../services/evaluation';
import { myScores } from '../services/evaluation-scores';
import { trackRecord } from '../services/track-record';

/** Evaluation (draft, approval, publication, reissue), lab scores and the Track record. */
export function evaluationRoutes(api: ApiRouter, ctx: AppContext): void {
  const coordinator = ['coordinator'] as const;
  api.add({
    method: 'post',
    path: '/rounds/{id}/evaluation',
    tag: 'evaluation',
    summary:
      'Evaluate a closed round as a draft (optional σ_pt overrides and exclusions, each with a reason)',
    access: coordinator,
    params: IdParams,
    body: EvaluationRequest,
    status: 201,
    response: EvaluationView,
    handler: ({ user, params, body }) => evaluation.computeDraft(ctx, user, params.id, body),
  });
  api.add({
    method: 'get',
    path: '/rounds/{id}/evaluation',
    tag: 'evaluation',
    summary: 'The newest evaluation of a round, with its inputs',
    access: coordinator,
    params: IdParams,
    response: EvaluationView,
    handler: ({ params }) => evaluation.getEvaluation(ctx, params.id),
  });
  api.add({
    method: 'post',
    path: '/rounds/{id}/evaluation/commit',
    tag: 'evaluation',
    summary: 'Approve the draft evaluation for publication (closed → evaluated)',
    access: coordinator,
    params: IdParams,
    response: EvaluationView,
    handler: ({ user, params }) => evaluation.commitEvaluation(ctx, user, params.id),
  });
  api.add({
    method: 'post',
    path: '/rounds/{id}/publish',
    tag: 'evaluation',
    summary:
      'Publish the evaluation approved for publication, e-mail every enrolled lab and open investigations for signals',
    access: coordinator,
    params: IdParams,
    response: PublishResponse,
    handler: ({ user, params }) => evaluation.publishEvaluation(ctx, user, params.id),
  });
  api.add({
    method: 'post',
    path: '/rounds/{id}/reissue',
    tag: 'evaluation',
    summary:
      'Correct a published round: a new evaluation version with a reason (published → reissued)',
    access: coordinator,
    params: IdParams,
    body: ReissueRequest,
    status: 201,
    response: EvaluationView,
    handler: ({ user, params, body }) =>
      evaluation.reissueEvaluation(ctx, user, params.id, body.reason, body.settings),
  });
  api.add({
    method: 'get',
    path: '/my/rounds/{id}/scores',
    tag: 'evaluation',
    summary: 'My lab’s published scores of a round, with a plain explanation',
    access: ['lab'],
    params: IdParams,
    query: LabQuery,
    response: LabScores,
    handler: ({ user, params, query }) => myScores(ctx, user, params.id, query.labId),
  });
  api.add({
    method: 'get',
    path: '/my/track-record',
    tag: 'evaluation',
    summary: 'My lab’s z-scores across rounds with run rules and the rescaled sum of z',
    access: ['lab'],
    query: LabQuery,
    response: TrackRecord,
    handler: ({ user, query }) => trackRecord(ctx, user, query.labId),
  });
}
