import argon2 from 'argon2';
import { describe, expect, it } from 'vitest';
import { hashPassword, verifyPassword } from './passwords';

// The API tests sign in with a deliberately cheap test hash, so the real cost of the app's hashes is held here.
describe('password hashing', () => {
  it('when the app hashes a password, then it uses Argon2id at 64 MiB, three passes and four lanes, and verifies it', async () => {
    const hash = await hashPassword('meadow-hutch-lantern-5');
    expect(hash).toMatch(/^\$argon2id\$v=19\$m=65536,t=3,p=4\$/);
    expect(await verifyPassword(hash, 'meadow-hutch-lantern-5')).toBe(true);
    expect(await verifyPassword(hash, 'meadow-hutch-lantern-6')).toBe(false);
  });

  it('when a stored hash was made with other parameters, then it is verified by the parameters it carries', async () => {
    const hash = await argon2.hash('meadow-hutch-lantern-5', { type: argon2.argon2id, memoryCost: 8, timeCost: 1, parallelism: 1 });
    expect(await verifyPassword(hash, 'meadow-hutch-lantern-5')).toBe(true);
    expect(await verifyPassword(hash, 'meadow-hutch-lantern-6')).toBe(false);
  });

  it('when there is no stored hash, then nothing verifies', async () => {
    expect(await verifyPassword(null, 'meadow-hutch-lantern-5')).toBe(false);
  });
});
