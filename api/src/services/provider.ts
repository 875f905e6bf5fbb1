/**
 * The PT provider's profile (one row) and the coordinator's comments on a round. The profile
 * is printed on every report, certificate and e-mail; the comments in the round report.
 */
import { sniffImageType } from '../../../shared/files/file-type';
import type { EntityManager } from 'typeorm';
import { ProviderProfile as ProfileRow } from '../../../db/entities/provider-profile';
import {
  LOGO_MAX_BYTES,
  type ProviderProfile,
  type ProviderProfileInput,
} from '../../../shared/contracts/provider';
import type { ReportProviderInfo } from '../../../reports/model';
import type { SessionUser } from '../auth/session-user';
import { badRequest, conflict, notFound } from '../http/errors';
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
    updatedAt: (r?.updatedAt ?? new Date(0)).toISOString(),
  };
}

/** The profile with the logo, for the report builders. */
export async function reportProvider(em: EntityManager): Promise<ReportProvider> {
  const rows: { logo: Buffer | null; logo_type: 'image/png' | 'image/jpeg' | null }[] =
    await em.query('SELECT logo, logo_type FROM provider_profile WHERE id = 1');
  const r = await em.findOne(ProfileRow, { where: { id: 1 } });
  const logo =
    rows[0]?.logo && rows[0].logo_type ? { type: rows[0].logo_type, data: rows[0].logo } : null;
  return { ...fields(r), logo };
}

/** The name mail shows in its From display name and signature ('' when none is set). */
export async function providerName(em: EntityManager): Promise<string> {
  const rows: { name: string }[] = await em.query('SELECT name FROM provider_profile WHERE id = 1');
  return rows[0]?.name ?? '';
}

export async function updateProviderProfile(
  ctx: AppContext,
  user: SessionUser,
  input: ProviderProfileInput,
): Promise<ProviderProfile> {
  await ctx.ds.transaction(async (tx) => {
    await tx.query('INSERT INTO provider_profile (id) VALUES (1) ON CONFLICT (id) DO NOTHING');
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
    await tx.query('INSERT INTO provider_profile (id) VALUES (1) ON CONFLICT (id) DO NOTHING');
    await tx.query(
      'UPDATE provider_profile SET logo = $1, logo_type = $2, updated_at = now(), updated_by = $3 WHERE id = 1',
      [data, type, user.id],
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
    await tx.query(
      'UPDATE provider_profile SET logo = NULL, logo_type = NULL, updated_at = now(), updated_by = $1 WHERE id = 1',
      [user.id],
    );
    await audit(tx, user.id, 'provider-profile.logo-removed', 'provider_profile', null);
  });
  return providerProfile(ctx.ds.manager);
}

export async function providerLogo(em: EntityManager): Promise<{ type: string; data: Buffer }> {
  const rows: { logo: Buffer | null; logo_type: string | null }[] = await em.query(
    'SELECT logo, logo_type FROM provider_profile WHERE id = 1',
  );
  if (!rows[0]?.logo || !rows[0].logo_type) throw notFound('The logo');
  return { type: rows[0].logo_type, data: rows[0].logo };
}

/** The coordinator's comments on the newest evaluation of a round. */
export async function roundComments(
  ctx: AppContext,
  roundId: string,
): Promise<{ comments: string; editable: boolean }> {
  const rows: { coordinator_comments: string; state: string }[] = await ctx.ds.query(
    'SELECT coordinator_comments, state FROM evaluation WHERE round_id = $1 ORDER BY version DESC LIMIT 1',
    [roundId],
  );
  if (!rows[0]) throw notFound('An evaluation of this round');
  return { comments: rows[0].coordinator_comments, editable: rows[0].state !== 'published' };
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
    const rows: { id: string; state: string }[] = await tx.query(
      'SELECT id, state FROM evaluation WHERE round_id = $1 ORDER BY version DESC LIMIT 1 FOR UPDATE',
      [roundId],
    );
    const e = rows[0];
    if (!e) throw notFound('An evaluation of this round');
    if (e.state === 'published')
      throw conflict(
        'evaluation_published',
        'The evaluation is published; its report no longer changes. Reissue the evaluation to change the comments.',
      );
    await tx.query('UPDATE evaluation SET coordinator_comments = $1 WHERE id = $2', [
      comments,
      e.id,
    ]);
    // Files built from this unpublished evaluation are previews; drop them so the next one shows the comments.
    await tx.query(`DELETE FROM report WHERE evaluation_id = $1`, [e.id]);
    await audit(tx, user.id, 'evaluation.comments-set', 'evaluation', e.id, {
      length: comments.length,
    });
  });
  return roundComments(ctx, roundId);
}
