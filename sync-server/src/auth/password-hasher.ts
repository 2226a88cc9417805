import { Inject, Injectable } from '@nestjs/common';
import { randomBytes, scrypt, type ScryptOptions, timingSafeEqual } from 'node:crypto';
import { ACCOUNTS_CONFIG, type AccountsConfig } from '../common/accounts-config.js';

/**
 * Password hashing with node's scrypt (memory-hard, RFC 7914, Percival 2009). Default cost
 * N = 2^15, r = 8, p = 1: 128·N·r = 32 MiB of memory and about 0.3 s of one core per hash on the
 * development machine. The OWASP Password Storage Cheat Sheet (from memory) asks for N = 2^17, r = 8,
 * p = 1 or equivalents such as N = 2^15 with p = 3; raise PW_SCRYPT_LOG2N / PW_SCRYPT_P on a real
 * server. Each password gets a 16-byte random salt; the key is 64 bytes. The stored string names its
 * parameters, so they can change without breaking existing hashes:
 *   scrypt$<log2 N>$<r>$<p>$<salt base64>$<key base64>
 * db/seeders/0001-demo-accounts.mjs writes the same format (a test signs in with the seeded users).
 */
const KEY_LENGTH = 64;
const SALT_LENGTH = 16;

function derive(password: string, salt: Buffer, log2N: number, r: number, p: number, keyLength: number): Promise<Buffer> {
  const N = 2 ** log2N;
  const options: ScryptOptions = { N, r, p, maxmem: 256 * N * r };
  return new Promise((resolve, reject) => {
    scrypt(password.normalize('NFKC'), salt, keyLength, options, (err, key) => (err ? reject(err) : resolve(key)));
  });
}

export async function hashPassword(password: string, cost: AccountsConfig['scrypt']): Promise<string> {
  const salt = randomBytes(SALT_LENGTH);
  const key = await derive(password, salt, cost.log2N, cost.r, cost.p, KEY_LENGTH);
  return ['scrypt', cost.log2N, cost.r, cost.p, salt.toString('base64'), key.toString('base64')].join('$');
}

/** Constant-time comparison against a stored hash; a malformed stored value never matches. */
export async function verifyPassword(password: string, stored: string): Promise<boolean> {
  const parts = stored.split('$');
  if (parts.length !== 6 || parts[0] !== 'scrypt') return false;
  const [log2N, r, p] = parts.slice(1, 4).map(Number) as [number, number, number];
  if (![log2N, r, p].every(Number.isInteger) || log2N < 10 || log2N > 20 || r < 1 || r > 32 || p < 1 || p > 16) return false;
  const salt = Buffer.from(parts[4]!, 'base64');
  const expected = Buffer.from(parts[5]!, 'base64');
  if (expected.length < 16) return false;
  const actual = await derive(password, salt, log2N, r, p, expected.length);
  return timingSafeEqual(actual, expected);
}

@Injectable()
export class PasswordHasher {
  private decoy: Promise<string> | undefined;

  constructor(@Inject(ACCOUNTS_CONFIG) private readonly config: AccountsConfig) {}

  hash(password: string): Promise<string> {
    return hashPassword(password, this.config.scrypt);
  }

  verify(password: string, stored: string): Promise<boolean> {
    return verifyPassword(password, stored);
  }

  /** Spend the time of a real check when there is no account, so timing does not tell. */
  async verifyDecoy(password: string): Promise<false> {
    this.decoy ??= this.hash(randomBytes(16).toString('hex'));
    await verifyPassword(password, await this.decoy);
    return false;
  }
}
