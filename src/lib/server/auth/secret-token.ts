/**
 * Secret tokens sent by e-mail (password reset, invitation) and how every token is stored: only its
 * SHA-256 is kept, so a database leak does not hand out working links.
 */
import { createHash, randomBytes } from 'node:crypto';

/** 32 random bytes, base64url (43 characters). */
export const newToken = () => randomBytes(32).toString('base64url');

/** Hex SHA-256 of a token's UTF-8 bytes: what the database stores and looks up. */
export const hashToken = (token: string) => createHash('sha256').update(token, 'utf8').digest('hex');
