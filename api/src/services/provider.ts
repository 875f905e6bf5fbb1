/**
 * The PT provider's profile (one row) and the coordinator's comments on a round. The profile
 * is printed on every report, certificate and e-mail; the comments in the round report.
 */
import { sniffImageType } from '../../../shared/files/file-type';
import type { EntityManager } from 'typeorm';
import { Evaluation, ProviderProfile as ProfileRow, Report } from '../../../db/entities';
import {
  LOGO_MAX_BYTES,
  type ProviderProfile,
  type ProviderProfileInput,
} from '../../../shared/contracts/provider';
import type { ReportProviderInfo } from '../../../reports/model';
import type { SessionUser } from '../auth/session-user';
import { badRequest, conflict, notFound } from './errors';
import { audit } from './audit';
import type { AppContext } from './context';

/** What a report prints of the provider (the logo's bytes included): one type, the reports' own. */
export type ReportProvider = ReportProviderInfo;

const EMPTY: Omit<ReportProvider, 'logo'> = {
  name: '',
  address: '',
  contactEmail: '',
  contactPhone: '',
  website: '',
  accreditationBody: '',
  accreditationNumber: '',
  authoriserName: '',
  authoriserRole: '',
  subcontracting: '',
};

function fields(r: ProfileRow | null): Omit<ReportProvider, 'logo'> {
  if (!r) return { ...EMPTY };
  return {
    name: r.name,
    address: r.address,
    contactEmail: r.contactEmail,
    contactPhone: r.contactPhone,
    website: r.website,
    accreditationBody: r.accreditationBody,
    accreditationNumber: r.accreditationNumber,
    authoriserName: r.authoriserName,
    authoriserRole: r.authoriserRole,
    subcontracting: r.subcontracting,
  };
}

export async function providerProfile(em: EntityManager): Promise<ProviderProfile> {
  const r = await em.findOne(ProfileRow, { where: { id: 1 } });
  return {
    ...fields(r),
    hasLogo: !!r?.logoType,
    logoType: r?.logoType ?? null,
    taxRateBp: r?.taxRateBp ?? 0,
    updatedAt: (r?.updatedAt ?? new Date(0)).toISOString(),
  };
}

/** The profile row with its logo's bytes (a column not selected by default). */
function withLogo(em: EntityManager): Promise<ProfileRow | null> {
  return em
    .createQueryBuilder(ProfileRow, 'p')
    .addSelect('p.logo')
    .where('p.id = :id', { id: 1 })
    .getOne();
}

/** Makes sure the one profile row exists (ON CONFLICT DO NOTHING). */
async function ensureProfileRow(em: EntityManager): Promise<void> {
  await em.createQueryBuilder().insert().into(ProfileRow).values({ id: 1 }).orIgnore().execute();
}

/** The profile with the logo, for the report builders. */
export async function reportProvider(em: EntityManager): Promise<ReportProvider> {
  const r = await withLogo(em);
  const logo = r?.logo && r.logoType ? { type: r.logoType, data: r.logo } : null;
  return { ...fields(r), logo };
}

/** The name mail shows in its From display name and signature ('' when none is set). */
export async function providerName(em: EntityManager): Promise<string> {
  const r = await em.findOne(ProfileRow, { select: { id: true, name: true }, where: { id: 1 } });
  return r?.name ?? '';
}

export async function updateProviderProfile(
  ctx: AppContext,
  user: SessionUser,
  input: ProviderProfileInput,
): Promise<ProviderProfile> {
  await ctx.ds.transaction(async (tx) => {
    await ensureProfileRow(tx);
    await tx.update(ProfileRow, { id: 1 }, { ...input, updatedAt: new Date(), updatedBy: user.id });
    await audit(tx, user.id, 'provider-profile.updated', 'provider_profile', null, {
      fields: Object.keys(input),
    });
  });
  return providerProfile(ctx.ds.manager);
}

/** The image type read from the file's first bytes (not from what the sender claims). */
export function imageType(data: Buffer): 'image/png' | 'image/jpeg' | null {
  return sniffImageType(data, ['png', 'jpeg']);
}

export async function setProviderLogo(
  ctx: AppContext,
  user: SessionUser,
  dataBase64: string,
): Promise<ProviderProfile> {
  const data = Buffer.from(dataBase64, 'base64');
  if (data.length === 0)
    throw badRequest('The logo is empty.', [{ path: 'dataBase64', message: 'The logo is empty.' }]);
  if (data.length > LOGO_MAX_BYTES)
    throw badRequest('The logo may be at most 256 KB.', [
      { path: 'dataBase64', message: 'The logo may be at most 256 KB.' },
    ]);
  const type = imageType(data);
  if (!type)
    throw badRequest('The logo must be a PNG or JPEG image.', [
      { path: 'dataBase64', message: 'The logo must be a PNG or JPEG image.' },
    ]);
  await ctx.ds.transaction(async (tx) => {
    await ensureProfileRow(tx);
    await tx.update(
      ProfileRow,
      { id: 1 },
      { logo: data, logoType: type, updatedAt: new Date(), updatedBy: user.id },
    );
    await audit(tx, user.id, 'provider-profile.logo-set', 'provider_profile', null, {
      type,
      bytes: data.length,
    });
  });
  return providerProfile(ctx.ds.manager);
}

export async function deleteProviderLogo(
  ctx: AppContext,
  user: SessionUser,
): Promise<ProviderProfile> {
  await ctx.ds.transaction(async (tx) => {
    await tx.update(
      ProfileRow,
      { id: 1 },
      { logo: null, logoType: null, updatedAt: new Date(), updatedBy: user.id },
    );
    await audit(tx, user.id, 'provider-profile.logo-removed', 'provider_profile', null);
  });
  return providerProfile(ctx.ds.manager);
}

export async function providerLogo(em: EntityManager): Promise<{ type: string; data: Buffer }> {
  const r = await withLogo(em);
  if (!r?.logo || !r.logoType) throw notFound('The logo');
  return { type: r.logoType, data: r.logo };
}

/** The coordinator's comments on the newest evaluation of a round. */
export async function roundComments(
  ctx: AppContext,
  roundId: string,
): Promise<{ comments: string; editable: boolean }> {
  const e = await ctx.ds.manager.findOne(Evaluation, {
    select: { id: true, coordinatorComments: true, state: true },
    where: { roundId },
    order: { version: 'DESC' },
  });
  if (!e) throw notFound('An evaluation of this round');
  return { comments: e.coordinatorComments, editable: e.state !== 'published' };
}

/**
 * Saves the comments on the newest evaluation while it is not published (a published report
 * does not change: a reissue makes a new version whose comments can be edited).
 */
export async function setRoundComments(
  ctx: AppContext,
  user: SessionUser,
  roundId: string,
  comments: string,
): Promise<{ comments: string; editable: boolean }> {
  await ctx.ds.transaction(async (tx) => {
    const e = await tx.findOne(Evaluation, {
      select: { id: true, state: true },
      where: { roundId },
      order: { version: 'DESC' },
      lock: { mode: 'pessimistic_write' },
    });
    if (!e) throw notFound('An evaluation of this round');
    if (e.state === 'published')
      throw conflict(
        'evaluation_published',
        'The evaluation is published; its report no longer changes. Reissue the evaluation to change the comments.',
      );
    await tx.update(Evaluation, { id: e.id }, { coordinatorComments: comments });
    // Files built from this unpublished evaluation are previews; drop them so the next one shows the comments.
    await tx.delete(Report, { evaluationId: e.id });
    await audit(tx, user.id, 'evaluation.comments-set', 'evaluation', e.id, {
      length: comments.length,
    });
  });
  return roundComments(ctx, roundId);
}
