import { createHash, randomBytes, randomUUID } from 'node:crypto';

/** A fresh unguessable token (256 bits, base64url) for links and refresh tokens. */
export function newToken(): string {
  return randomBytes(32).toString('base64url');
}

/** How tokens are stored: hex SHA-256 (tokens are random, so no salt or slow hash is needed). */
export function sha256Hex(value: string): string {
  return createHash('sha256').update(value, 'utf8').digest('hex');
}

export const newId = (): string => randomUUID();

/** E-mail addresses compare case-insensitively and without surrounding space. */
export function normalizeEmail(email: string): string {
  return email.trim().toLowerCase();
}
