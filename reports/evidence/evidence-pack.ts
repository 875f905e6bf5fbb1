/**
 * The Evidence pack: one zip an assessor can keep, standing on its own: the round reports,
 * workbooks, the lab's individual reports and certificates, its investigations, its
 * instrument-check history, an audit extract, a README and manifest.json listing every file
 * with its SHA-256 (the manifest does not list itself).
 */
import archiver, { type Archiver } from 'archiver';
import { PassThrough } from 'node:stream';
import type { EvidenceManifest } from '../../shared/contracts/reports';
import { sha256 } from '../model';

export interface EvidenceFile {
  /** Path inside the zip, forward slashes. */
  path: string;
  data: Buffer;
}

export interface EvidenceMeta {
  lab: string;
  generatedFor: string;
  generatedAt: string;
}

export function evidenceManifest(files: EvidenceFile[], meta: EvidenceMeta): EvidenceManifest {
  return {
    lab: meta.lab,
    generatedAt: meta.generatedAt,
    generatedFor: meta.generatedFor,
    files: files.map((f) => ({ path: f.path, sha256: sha256(f.data), bytes: f.data.length })),
  };
}

export function evidenceReadme(meta: EvidenceMeta, manifest: EvidenceManifest): string {
  return [
    `Ringlet Evidence pack`,
    ``,
    `Lab: ${meta.lab}`,
    `Made for: ${meta.generatedFor}`,
    `Made at: ${meta.generatedAt} (UTC)`,
    ``,
    `Contents`,
    `- rounds/<round code>/: the round report (PDF) and workbook (XLSX), this laboratory's individual report and certificate of participation.`,
    `  Other participants appear only by their participant codes.`,
    `- investigations.json: this laboratory's investigations of warning and action signals (cause, corrective action, effectiveness check).`,
    `- instrument-checks.json: its instrument checks against reference materials.`,
    `- audit-extract.json: the audit-trail events about this laboratory, its investigations and the evaluation of its rounds.`,
    `- manifest.json: the SHA-256 of every file above; check one with "sha256sum <file>".`,
    ``,
    `${manifest.files.length} files.`,
    ``,
  ].join('\n');
}

/** Zips the files with README.txt and manifest.json; resolves to the zip bytes. */
export async function buildEvidencePack(files: EvidenceFile[], meta: EvidenceMeta): Promise<Buffer> {
  const manifest0 = evidenceManifest(files, meta);
  const readme = Buffer.from(evidenceReadme(meta, manifest0), 'utf8');
  const all = [...files, { path: 'README.txt', data: readme }];
  const manifest = evidenceManifest(all, meta);
  // archiver 7 exports a factory function; the installed @types/archiver (8.x) describes classes.
  const zip = (archiver as unknown as (format: 'zip', options: object) => Archiver)('zip', { zlib: { level: 6 } });
  const out = new PassThrough();
  const chunks: Buffer[] = [];
  out.on('data', (c: Buffer) => chunks.push(c));
  const done = new Promise<Buffer>((resolve, reject) => {
    out.on('end', () => resolve(Buffer.concat(chunks)));
    zip.on('error', reject);
  });
  zip.pipe(out);
  const date = new Date(meta.generatedAt);
  for (const f of all) zip.append(f.data, { name: f.path, date });
  zip.append(Buffer.from(JSON.stringify(manifest, null, 2), 'utf8'), { name: 'manifest.json', date });
  await zip.finalize();
  return done;
}
