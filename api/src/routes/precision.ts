import { IdParams } from '../../../shared/contracts/common';
import {
  PrecisionAnalysis,
  PrecisionDecisionsBody,
  PrecisionExclusionList,
  PrecisionExclusionParams,
  PrecisionReferencesBody,
  PrecisionSigmaSources,
  PrecisionWithdrawBody,
} from '../../../shared/contracts/precision';
import { sendDownload } from '../http/downloads';
import type { ApiRouter } from '../http/route';
import type { AppContext } from '../services/context';
import * as precision from '../services/precision';

/** Precision studies (rounds of kind 'precision', ISO 5725-2): analysis, decisions, references. */
export function precisionRoutes(api: ApiRouter, ctx: AppContext): void {
  const coordinator = ['coordinator'] as const;
  const notStudy =
    ' A proficiency-testing round answers 422 `not_a_precision_study`; another round id 404.';
  api.add({
    method: 'get',
    path: '/rounds/{id}/precision',
    tag: 'precision',
    summary:
      'Precision study analysis (ISO 5725-2): per level × measurand the cells, Mandel h/k, Cochran, Grubbs, s_r, s_L, s_R, r, R, the §7.5 level fit and the bias against reference values',
    description:
      'Built from the labs’ current submitted versions and the decisions in force. Readable from Collecting on (409 before).' +
      notStudy,
    access: coordinator,
    params: IdParams,
    response: PrecisionAnalysis,
    handler: ({ params }) => precision.getPrecision(ctx, params.id),
  });
  api.add({
    method: 'get',
    path: '/rounds/{id}/precision/exclusions',
    tag: 'precision',
    summary:
      'Every decision on a flagged cell or replicate of a precision study, withdrawn ones too',
    description: notStudy.trim(),
    access: coordinator,
    params: IdParams,
    response: PrecisionExclusionList,
    handler: ({ params }) => precision.listExclusions(ctx, params.id),
  });
  api.add({
    method: 'post',
    path: '/rounds/{id}/precision/exclusions',
    tag: 'precision',
    summary:
      'Set aside (confirmed) or keep (rejected) flagged cells or single replicates, each with a reason; answers the new analysis',
    description:
      'Only while the study is Closed (409 otherwise). A decision naming a level, measurand, participant or replicate without submitted data answers 400 naming the field; nothing is stored then.' +
      notStudy,
    access: coordinator,
    params: IdParams,
    body: PrecisionDecisionsBody,
    status: 201,
    response: PrecisionAnalysis,
    handler: ({ user, params, body }) => precision.recordDecisions(ctx, user, params.id, body),
  });
  api.add({
    method: 'post',
    path: '/rounds/{id}/precision/exclusions/{exclusionId}/withdraw',
    tag: 'precision',
    summary: 'Withdraw a decision (with a reason); the flag it answered is open again',
    description: 'Only while the study is Closed (409 otherwise).' + notStudy,
    access: coordinator,
    params: PrecisionExclusionParams,
    body: PrecisionWithdrawBody,
    response: PrecisionAnalysis,
    handler: ({ user, params, body }) =>
      precision.withdrawDecision(ctx, user, params.id, params.exclusionId, body),
  });
  api.add({
    method: 'put',
    path: '/rounds/{id}/precision/references',
    tag: 'precision',
    summary:
      'Set the accepted reference values of the levels (item × measurand), for the bias (ISO 5725-4); replaces the list',
    description: 'Until the study is finished (409 after).' + notStudy,
    access: coordinator,
    params: IdParams,
    body: PrecisionReferencesBody,
    response: PrecisionAnalysis,
    handler: ({ user, params, body }) => precision.putReferences(ctx, user, params.id, body),
  });
  api.add({
    method: 'post',
    path: '/rounds/{id}/precision/finish',
    tag: 'precision',
    summary:
      'Finish the precision study (Closed → Evaluated) once every straggler and outlier flag has a decision',
    description:
      '422 `undecided_flags` lists the flags still open. A finished study’s s_R can be picked as σ_pt in a later PT round of the scheme.' +
      notStudy,
    access: coordinator,
    params: IdParams,
    response: PrecisionAnalysis,
    handler: ({ user, params }) => precision.finishStudy(ctx, user, params.id),
  });
  api.add({
    method: 'get',
    path: '/schemes/{id}/precision-sources',
    tag: 'precision',
    summary:
      'The scheme’s finished precision studies with s_r and s_R per measurand and level, to pick σ_pt for a PT round',
    access: coordinator,
    params: IdParams,
    response: PrecisionSigmaSources,
    handler: ({ params }) => precision.precisionSources(ctx, params.id),
  });
  for (const kind of ['precision.pdf', 'precision.xlsx'] as const) {
    const pdf = kind === 'precision.pdf';
    api.add({
      method: 'get',
      path: `/rounds/{id}/reports/${kind}`,
      tag: 'reports',
      summary: pdf
        ? 'Precision study report (PDF): design, data by participant code, decisions with reasons, tests, s_r, s_R, r, R, Mandel h/k charts, level fit, bias, references'
        : 'Precision study workbook (Excel): summary, data, tests, decisions, level fit, bias',
      description:
        'From Collecting on; marked as a preview until the study is finished. Participant codes only.' +
        notStudy,
      access: coordinator,
      params: IdParams,
      produces: pdf
        ? 'application/pdf'
        : 'application/vnd.openxmlformats-officedocument.spreadsheetml.sheet',
      handler: async ({ params, res }) => {
        const input = await precision.precisionReportInput(ctx, params.id);
        // Loaded at the first report: the PDF's charts bring ECharts, a large part of start-up.
        const file = pdf
          ? await (
              await import('../../../reports/pdf/precision-report')
            ).buildPrecisionReportPdf(input)
          : await (
              await import('../../../reports/excel/precision-workbook')
            ).buildPrecisionWorkbook(input);
        sendDownload(res, {
          file,
          contentType: pdf
            ? 'application/pdf'
            : 'application/vnd.openxmlformats-officedocument.spreadsheetml.sheet',
          fileName: `${input.analysis.round.code}-precision.${pdf ? 'pdf' : 'xlsx'}`,
        });
      },
    });
  }
}
