/**
 * The demo PT provider's profile (invented name, address and people) with a small generated
 * logo (a ring, drawn here as a PNG), so the demo reports show a provider's identity.
 */
import { crc32, deflateSync } from 'node:zlib';
import type { EntityManager } from 'typeorm';

export const DEMO_PROVIDER_PROFILE = {
  name: 'Larkspur Interlaboratory Services',
  address: 'Unit 4, Quarry Lane Science Park\nMillbrook MB4 7QX\nNowhere',
  contactEmail: 'pt-office@larkspur-ils.example',
  contactPhone: '+00 1632 960 123',
  website: 'https://larkspur-ils.example',
  accreditationBody: 'Nowhere National Accreditation Service (invented)',
  accreditationNumber: 'PTP-0427',
  authoriserName: 'Dr Imogen Vale',
  authoriserRole: 'Technical manager, proficiency testing',
  subcontracting:
    'No part of the scheme is subcontracted: the provider prepares, tests and ships the test items and evaluates the results itself. ' +
    'Transport is by courier under the provider’s instructions.',
};

function chunk(type: string, data: Buffer): Buffer {
  const len = Buffer.alloc(4);
  len.writeUInt32BE(data.length);
  const body = Buffer.concat([Buffer.from(type, 'ascii'), data]);
  const crc = Buffer.alloc(4);
  crc.writeUInt32BE(crc32(body) >>> 0);
  return Buffer.concat([len, body, crc]);
}

/** A 96 × 96 RGB PNG: an ink ring with a teal centre on white. */
export function demoLogoPng(): Buffer {
  const size = 96;
  const rows: Buffer[] = [];
  for (let y = 0; y < size; y++) {
    const row = Buffer.alloc(1 + size * 3);
    for (let x = 0; x < size; x++) {
      const r = Math.hypot(x - 47.5, y - 47.5);
      const [cr, cg, cb] =
        r > 44
          ? [255, 255, 255]
          : r > 32
            ? [0x1f, 0x3a, 0x5f]
            : r > 26
              ? [255, 255, 255]
              : r > 14
                ? [0x1b, 0x7f, 0x79]
                : [255, 255, 255];
      row[1 + x * 3] = cr!;
      row[2 + x * 3] = cg!;
      row[3 + x * 3] = cb!;
    }
    rows.push(row);
  }
  const ihdr = Buffer.alloc(13);
  ihdr.writeUInt32BE(size, 0);
  ihdr.writeUInt32BE(size, 4);
  ihdr[8] = 8; // bit depth
  ihdr[9] = 2; // RGB
  return Buffer.concat([
    Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]),
    chunk('IHDR', ihdr),
    chunk('IDAT', deflateSync(Buffer.concat(rows))),
    chunk('IEND', Buffer.alloc(0)),
  ]);
}

/** Sets the demo provider profile unless one was already written (idempotent). */
export async function seedProviderProfile(em: EntityManager): Promise<void> {
  const p = DEMO_PROVIDER_PROFILE;
  await em.query(
    `INSERT INTO provider_profile (id, name, address, contact_email, contact_phone, website, accreditation_body, accreditation_number,
                                   authoriser_name, authoriser_role, subcontracting, logo, logo_type)
     VALUES (1, $1, $2, $3, $4, $5, $6, $7, $8, $9, $10, $11, 'image/png') ON CONFLICT (id) DO NOTHING`,
    [
      p.name,
      p.address,
      p.contactEmail,
      p.contactPhone,
      p.website,
      p.accreditationBody,
      p.accreditationNumber,
      p.authoriserName,
      p.authoriserRole,
      p.subcontracting,
      demoLogoPng(),
    ],
  );
}
