import * as z from 'zod';
import { Organisation } from '../../../shared/contracts/admin';
import { IdParams } from '../../../shared/contracts/common';
import {
  DispatchInput,
  Enrolment,
  EnrolmentParams,
  ExtensionGrant,
  Invitation,
  InvitationAcceptResult,
  InvitationInfo,
  InvitationsCreate,
  ItemParams,
  Measurand,
  MeasurandInput,
  MeasurandParams,
  MeasurandUpdate,
  RoundCreate,
  RoundDetail,
  RoundSummary,
  RoundUpdate,
  Scheme,
  SchemeCreate,
  Study,
  StudyDecision,
  StudyInput,
  StudyParams,
  TestItem,
  TestItemInput,
  TestItemUpdate,
  TokenParams,
  TransitionRequest,
  Withdrawal,
} from '../../../shared/contracts/rounds';
import { EVALUATION_TARGETS, ROUND_STATE_LABELS } from '../../../shared/contracts/round-states';
import { describeLimit, STUDY_FILE_LIMIT } from '../../../shared/contracts/upload-limits';
import { conflict, describe, fieldIssues, HttpError, ruleBroken } from '../http/errors';
import type { ApiRouter } from '../http/route';
import { uploadedFile, uploadRule } from '../http/uploads';
import type { AppContext } from '../services/context';
import { labAddresses } from '../services/evaluation';
import * as enrolment from '../services/enrolment';
import * as homogeneity from '../services/homogeneity';
import { homogeneityFromRows, readRows, stabilityFromRows } from '../services/homogeneity-file';
import { isCoordinatorTransition, lockRound, transitionRound } from '../services/round-lifecycle';
import * as rounds from '../services/rounds';
import { recordDispatch } from '../services/shipments';
import { listOrganisations } from '../services/users';

const UploadFields = z.object({
  kind: z.enum(['homogeneity', 'stability']),
  testItemId: z.uuid(),
  measurandId: z.uuid(),
  sigmaPt: z
    .string()
    .optional()
    .transform((s) => (s && s.trim() ? Number(s) : null))
    .pipe(z.number().positive({ message: 'σ_pt must be above 0.' }).nullable()),
});

/** Round desk routes: schemes, rounds and their lifecycle, items, measurands, enrolment, shipments, homogeneity. */
export function roundRoutes(api: ApiRouter, ctx: AppContext): void {
  const coordinator = ['coordinator'] as const;
  const tag = 'round desk';

  api.add({
    method: 'get',
    path: '/schemes',
    tag,
    summary: 'All PT schemes',
    access: coordinator,
    response: z.array(Scheme),
    handler: () => rounds.listSchemes(ctx),
  });
  api.add({
    method: 'post',
    path: '/schemes',
    tag,
    summary: 'Create a scheme (DLS default measurands unless given)',
    access: coordinator,
    body: SchemeCreate,
    status: 201,
    response: Scheme,
    handler: ({ body, user }) => rounds.createScheme(ctx, user, body),
  });
  api.add({
    method: 'get',
    path: '/rounds',
    tag,
    summary: 'All rounds, newest first',
    access: coordinator,
    response: z.array(RoundSummary),
    handler: () => rounds.listRounds(ctx),
  });
  api.add({
    method: 'post',
    path: '/rounds',
    tag,
    summary: "Create a round in draft, with its test items and the scheme's measurands",
    access: coordinator,
    body: RoundCreate,
    status: 201,
    response: RoundDetail,
    handler: ({ body, user }) => rounds.createRound(ctx, user, body),
  });
  api.add({
    method: 'get',
    path: '/rounds/{id}',
    tag,
    summary: 'A round with items, measurands and its transition history',
    access: coordinator,
    params: IdParams,
    response: RoundDetail,
    handler: ({ params }) => rounds.getRoundDetail(ctx.ds.manager, params.id),
  });
  api.add({
    method: 'patch',
    path: '/rounds/{id}',
    tag,
    summary: "Change a round's title, dates, instructions or fee",
    access: coordinator,
    params: IdParams,
    body: RoundUpdate,
    response: RoundDetail,
    handler: ({ params, body, user }) => rounds.updateRound(ctx, user, params.id, body),
  });
  api.add({
    method: 'post',
    path: '/rounds/{id}/transitions',
    tag,
    summary: 'Move a round through its lifecycle',
    description:
      'Allowed moves come from ROUND_TRANSITIONS. 409 transition_not_allowed for a move the lifecycle does not have; ' +
      '422 round_incomplete (enrolling needs an item and a measurand), no_participants, results_not_due (closing before the due date needs `force: true`, shown as "Close early", and a reason), ' +
      'reason_required. Evaluation, publication and reissue run from the evaluation page (409 transition_owned_by_evaluation). ' +
      'Reopening for results (closed → collecting) e-mails every enrolled lab with the reason.',
    access: coordinator,
    params: IdParams,
    body: TransitionRequest,
    response: RoundDetail,
    handler: async ({ params, body, user }) => {
      const out = await ctx.ds.transaction(async (em) => {
        const round = await lockRound(em, params.id);
        if (
          !isCoordinatorTransition(round.state, body.to) &&
          EVALUATION_TARGETS.includes(body.to)
        ) {
          throw conflict(
            'transition_owned_by_evaluation',
            `${ROUND_STATE_LABELS[body.to]}: evaluation, publication and reissue are done from the evaluation page.`,
          );
        }
        const reopening = round.state === 'closed' && body.to === 'collecting';
        await transitionRound(
          em,
          params.id,
          body.to,
          { id: user.id },
          { reason: body.reason, force: body.force },
        );
        const addresses = reopening ? await labAddresses(em, params.id) : [];
        return { detail: await rounds.getRoundDetail(em, params.id), addresses };
      });
      // Reopen for results: every enrolled lab hears of it, with the reason (after the commit).
      for (const a of out.addresses.filter((x) => x.to.length > 0)) {
        await enrolment.sendSafely(ctx, {
          to: a.to,
          subject: `Round ${out.detail.code} accepts results again`,
          text:
            `Hello ${a.labName},\n\nRound ${out.detail.code} (${out.detail.title}) was reopened for results.\n` +
            `Reason: ${body.reason ?? ''}\n\nYour participant code is ${a.code}. You can enter, change and submit replicates on your Lab bench again:\n\n` +
            `${ctx.config.publicUrl}/bench\n\nRinglet`,
        });
      }
      return out.detail;
    },
  });
  api.add({
    method: 'post',
    path: '/rounds/{id}/items',
    tag,
    summary: 'Add test items (draft or enrolling)',
    access: coordinator,
    params: IdParams,
    body: z.object({ items: z.array(TestItemInput).min(1).max(20) }),
    status: 201,
    response: z.array(TestItem),
    handler: ({ params, body, user }) => rounds.addItems(ctx, user, params.id, body.items),
  });
  api.add({
    method: 'post',
    path: '/rounds/{id}/measurands',
    tag,
    summary: 'Add measurands (draft or enrolling)',
    access: coordinator,
    params: IdParams,
    body: z.object({ measurands: z.array(MeasurandInput).min(1).max(20) }),
    status: 201,
    response: z.array(Measurand),
    handler: ({ params, body, user }) =>
      rounds.addMeasurands(ctx, user, params.id, body.measurands),
  });
  const designRules =
    '409 round_not_editable once the round has left enrolling (items and measurands change only in draft or enrolling); ';
  api.add({
    method: 'patch',
    path: '/rounds/{id}/items/{itemId}',
    tag,
    summary: 'Change one test item (draft or enrolling)',
    description: designRules + '409 item_code_taken for a code the round already has.',
    access: coordinator,
    params: ItemParams,
    body: TestItemUpdate,
    response: TestItem,
    handler: ({ params, body, user }) =>
      rounds.updateItem(ctx, user, params.id, params.itemId, body),
  });
  api.add({
    method: 'delete',
    path: '/rounds/{id}/items/{itemId}',
    tag,
    summary: 'Remove one test item (draft or enrolling)',
    description:
      designRules +
      '409 item_has_checks while homogeneity or stability studies are recorded for it; 422 round_incomplete for the last item of an enrolling round.',
    access: coordinator,
    params: ItemParams,
    status: 204,
    handler: ({ params, user }) => rounds.deleteItem(ctx, user, params.id, params.itemId),
  });
  api.add({
    method: 'patch',
    path: '/rounds/{id}/measurands/{measurandId}',
    tag,
    summary: 'Change one measurand, its σ_pt or assigned-value rule (draft or enrolling)',
    description: designRules + '409 measurand_key_taken for a key the round already has.',
    access: coordinator,
    params: MeasurandParams,
    body: MeasurandUpdate,
    response: Measurand,
    handler: ({ params, body, user }) =>
      rounds.updateMeasurand(ctx, user, params.id, params.measurandId, body),
  });
  api.add({
    method: 'delete',
    path: '/rounds/{id}/measurands/{measurandId}',
    tag,
    summary: 'Remove one measurand (draft or enrolling)',
    description:
      designRules +
      '409 measurand_has_checks while homogeneity or stability studies are recorded for it; 422 round_incomplete for the last measurand of an enrolling round.',
    access: coordinator,
    params: MeasurandParams,
    status: 204,
    handler: ({ params, user }) => rounds.deleteMeasurand(ctx, user, params.id, params.measurandId),
  });

  // ---- invitations and enrolment ----
  api.add({
    method: 'get',
    path: '/lab-directory',
    tag,
    summary: 'Labs the coordinator can invite',
    access: coordinator,
    response: z.array(Organisation),
    handler: async () => (await listOrganisations(ctx)).filter((o) => o.kind === 'lab'),
  });
  api.add({
    method: 'get',
    path: '/rounds/{id}/invitations',
    tag,
    summary: 'Invitations sent for a round',
    access: coordinator,
    params: IdParams,
    response: z.array(Invitation),
    handler: ({ params }) => enrolment.listInvitations(ctx, params.id),
  });
  api.add({
    method: 'post',
    path: '/rounds/{id}/invitations',
    tag,
    summary: 'Invite labs by e-mail (existing labs or a new lab by contact address)',
    access: coordinator,
    params: IdParams,
    body: InvitationsCreate,
    status: 201,
    response: z.array(Invitation),
    handler: ({ params, body, user }) =>
      enrolment.createInvitations(ctx, user, params.id, body.invitations),
  });
  api.add({
    method: 'get',
    path: '/invitations/{token}',
    tag,
    summary: 'What an invitation link offers (before accepting)',
    access: 'public',
    params: TokenParams,
    response: InvitationInfo,
    handler: ({ params }) => enrolment.invitationInfo(ctx, params.token),
  });
  api.add({
    method: 'post',
    path: '/invitations/{token}/accept',
    tag,
    summary: 'Accept an invitation: enrols the lab with a random participant code',
    description:
      "An existing lab's invitation needs a signed-in member of that lab. A new lab's invitation creates the lab and, for a new address, " +
      'an account that receives a first-password link. The link works once (then 404 link_invalid).',
    access: 'public',
    params: TokenParams,
    status: 201,
    response: InvitationAcceptResult,
    handler: ({ params, req }) => enrolment.acceptInvitation(ctx, req.user, params.token),
  });
  api.add({
    method: 'get',
    path: '/rounds/{id}/enrolments',
    tag,
    summary: 'Enrolled labs with participant codes, shipment and receipt status',
    access: coordinator,
    params: IdParams,
    response: z.array(Enrolment),
    handler: ({ params }) => enrolment.listEnrolments(ctx.ds.manager, params.id),
  });
  api.add({
    method: 'post',
    path: '/rounds/{id}/enrolments/{enrolmentId}/withdrawal',
    tag,
    summary: 'Withdraw an enrolment with a reason',
    access: coordinator,
    params: EnrolmentParams,
    body: Withdrawal,
    response: Enrolment,
    handler: ({ params, body, user }) =>
      enrolment.withdrawEnrolment(ctx, user, params.id, params.enrolmentId, body.reason),
  });
  api.add({
    method: 'post',
    path: '/rounds/{id}/enrolments/{enrolmentId}/extension',
    tag,
    summary: 'Grant a lab a late-submission extension with a reason',
    access: coordinator,
    params: EnrolmentParams,
    body: ExtensionGrant,
    response: Enrolment,
    handler: ({ params, body, user }) =>
      enrolment.grantExtension(ctx, user, params.id, params.enrolmentId, body),
  });
  api.add({
    method: 'post',
    path: '/rounds/{id}/enrolments/{enrolmentId}/dispatch',
    tag,
    summary: 'Record the dispatch of the test items to a lab (e-mails the lab)',
    access: coordinator,
    params: EnrolmentParams,
    body: DispatchInput,
    response: Enrolment,
    handler: ({ params, body, user }) =>
      recordDispatch(ctx, user, params.id, params.enrolmentId, body),
  });

  // ---- homogeneity and stability ----
  api.add({
    method: 'get',
    path: '/rounds/{id}/homogeneity',
    tag,
    summary: 'Homogeneity and stability studies of a round',
    access: coordinator,
    params: IdParams,
    response: z.array(Study),
    handler: ({ params }) => homogeneity.listStudies(ctx.ds.manager, params.id),
  });
  api.add({
    method: 'post',
    path: '/rounds/{id}/homogeneity',
    tag,
    summary: 'Enter a homogeneity or stability study; the ISO 13528 check is computed and stored',
    access: coordinator,
    params: IdParams,
    body: StudyInput,
    status: 201,
    response: Study,
    handler: ({ params, body, user }) => homogeneity.recordStudy(ctx, user, params.id, body),
  });
  api.router.post('/rounds/:id/homogeneity/upload', uploadRule(STUDY_FILE_LIMIT, coordinator));
  api.add({
    method: 'post',
    path: '/rounds/{id}/homogeneity/upload',
    tag,
    summary:
      'Upload a homogeneity or stability study as CSV or XLSX (multipart: file, kind, testItemId, measurandId, sigmaPt)',
    description:
      'Homogeneity: one row per item, first cell the item label, then its replicate results. Stability: rows "first|second, result". ' +
      `A header row is skipped. The type is checked by content. ${describeLimit(STUDY_FILE_LIMIT)}`,
    access: coordinator,
    params: IdParams,
    status: 201,
    response: Study,
    handler: async ({ params, req, user }) => {
      const file = uploadedFile(req);
      if (!file)
        throw new HttpError(400, 'validation_failed', 'file: attach a CSV or XLSX file.', [
          { path: 'file', message: 'Attach a CSV or XLSX file.' },
        ]);
      const fields = UploadFields.safeParse(req.body ?? {});
      if (!fields.success) {
        const details = fieldIssues(fields.error);
        throw new HttpError(400, 'validation_failed', describe(details), details);
      }
      const rows = await readRows(file.buffer, file.originalname);
      if (!rows.length) throw ruleBroken('file_empty', 'file: the file has no rows.');
      const data =
        fields.data.kind === 'homogeneity' ? homogeneityFromRows(rows) : stabilityFromRows(rows);
      const parsed = StudyInput.safeParse({ ...fields.data, data });
      if (!parsed.success) {
        const details = fieldIssues(parsed.error);
        throw new HttpError(400, 'validation_failed', describe(details), details);
      }
      return homogeneity.recordStudy(ctx, user, params.id, parsed.data);
    },
  });
  api.add({
    method: 'post',
    path: '/rounds/{id}/homogeneity/{studyId}/decision',
    tag,
    summary: 'Record the decision on a failing homogeneity or stability study',
    access: coordinator,
    params: StudyParams,
    body: StudyDecision,
    response: Study,
    handler: ({ params, body, user }) =>
      homogeneity.decideStudy(ctx, user, params.id, params.studyId, body),
  });
}
