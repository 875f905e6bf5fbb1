import bcrypt from 'bcryptjs';
import { BCRYPT_COST, DUMMY_HASH } from './passwords';

describe('the stand-in hash for unknown e-mails', () => {
  it('costs what a real password check costs: a bcrypt hash at BCRYPT_COST', async () => {
    expect(bcrypt.getRounds(DUMMY_HASH)).toBe(BCRYPT_COST);
    expect(BCRYPT_COST).toBeGreaterThanOrEqual(12); // docs/QUALITY.md, "Security"
    await expect(bcrypt.compare('any password at all', DUMMY_HASH)).resolves.toBe(false);
  });
});
