import bcrypt from 'bcryptjs';
import { seedProviderProfile } from './demo-provider';
import type { DataSource } from 'typeorm';
import { Membership, Organisation, User } from '../entities';
import { DEMO_LABS, DEMO_PROVIDER, DEMO_USERS, OTHER_LABS } from './demo-people';
import { seedScenario } from './demo-scenario';

const BCRYPT_COST = 12;

/**
 * Loads the demo scenario. Idempotent: organisations and users are matched by name and e-mail,
 * so running it twice changes nothing.
 */
export async function seedDemo(
  ds: DataSource,
  password: string,
  publicUrl?: string,
): Promise<void> {
  const hash = await bcrypt.hash(password, BCRYPT_COST);
  const allLabIds = await ds.transaction(async (em) => {
    const orgId = async (
      name: string,
      kind: 'lab' | 'provider',
      country: string,
      contactEmail: string | null = null,
    ) => {
      const found = await em.findOne(Organisation, { where: { name } });
      if (found) return found.id;
      return (
        await em.save(Organisation, em.create(Organisation, { name, kind, country, contactEmail }))
      ).id;
    };
    await orgId(DEMO_PROVIDER.name, 'provider', DEMO_PROVIDER.country);
    await seedProviderProfile(em);
    const labIds = new Map<string, string>();
    for (const lab of DEMO_LABS) labIds.set(lab.key, await orgId(lab.name, 'lab', lab.country));
    const others: string[] = [];
    for (const [i, name] of OTHER_LABS.entries()) {
      const slug = name
        .toLowerCase()
        .replace(/[^a-z]+/g, '-')
        .replace(/^-|-$/g, '');
      others.push(
        await orgId(
          name,
          'lab',
          ['Northland', 'Eastmark', 'Westvale', 'Southreach'][i % 4]!,
          `pt-contact@${slug}.example`,
        ),
      );
    }

    for (const u of DEMO_USERS) {
      let user = await em.findOne(User, { where: { email: u.email } });
      if (!user) {
        user = await em.save(
          User,
          em.create(User, {
            email: u.email,
            name: u.name,
            roles: [...u.roles],
            passwordHash: hash,
            isDemo: true,
          }),
        );
      } else {
        await em.update(
          User,
          { id: user.id },
          { passwordHash: hash, isActive: true, isDemo: true },
        );
      }
      if (u.lab) {
        const organisationId = labIds.get(u.lab)!;
        const m = await em.findOne(Membership, { where: { userId: user.id, organisationId } });
        if (!m)
          await em.insert(Membership, { userId: user.id, organisationId, isManager: u.manager });
      }
    }
    return [...DEMO_LABS.map((l) => labIds.get(l.key)!), ...others];
  });
  await seedScenario(ds, allLabIds, publicUrl);
}

/** True when the database holds no users yet (a fresh install). */
export async function isEmpty(ds: DataSource): Promise<boolean> {
  return (await ds.getRepository(User).count()) === 0;
}
