import { describe, expect, test } from 'vitest';
import { scryptSync } from 'node:crypto';
import { dummyHash, hashPassword, verifyPassword } from '../../../src/lib/server/auth/password';

describe('password hashing (scrypt, RFC 7914)', () => {
  test('a hash verifies its own password and no other', async () => {
    const h = await hashPassword('correct horse battery');
    expect(await verifyPassword(h, 'correct horse battery')).toBe(true);
    expect(await verifyPassword(h, 'correct horse battery ')).toBe(false);
    expect(await verifyPassword(h, '')).toBe(false);
  });

  test('the stored form carries algorithm and parameters, and salts differ per hash', async () => {
    const a = await hashPassword('same password here');
    const b = await hashPassword('same password here');
    expect(a.split('$').slice(0, 4)).toEqual(['scrypt', String(1 << 15), '8', '1']);
    expect(a).not.toBe(b);
  });

  test('the derived key equals an independent scrypt of the same salt (node:crypto reference)', async () => {
    const h = await hashPassword('reference check pw');
    const [, n, r, p, salt, key] = h.split('$');
    const expected = scryptSync('reference check pw'.normalize('NFKC'), Buffer.from(salt!, 'base64url'), 32, {
      N: Number(n), r: Number(r), p: Number(p), maxmem: 64 * 1024 * 1024,
    });
    expect(Buffer.from(key!, 'base64url').equals(expected)).toBe(true);
  });

  test('RFC 7914 §12 test vector: scrypt("password", "NaCl", N=1024, r=8, p=16, dkLen=64)', () => {
    // Source: RFC 7914, section 12 (second test vector). Checks the primitive the module builds on.
    const k = scryptSync('password', 'NaCl', 64, { N: 1024, r: 8, p: 16 });
    expect(k.toString('hex')).toBe(
      'fdbabe1c9d3472007856e7190d01e9fe7c6ad7cbc8237830e77376634b373162' +
        '2eaf30d92e22a3886ff109279d9830dac727afb94a83ee6d8360cbdfa2cc0640',
    );
  });

  test('Unicode passwords are normalised (NFKC) so composed and decomposed forms match', async () => {
    const h = await hashPassword('caf\u00e9-au-lait-42');
    expect(await verifyPassword(h, 'cafe\u0301-au-lait-42')).toBe(true);
  });

  test('malformed stored hashes never verify', async () => {
    expect(await verifyPassword('', 'x')).toBe(false);
    expect(await verifyPassword('bcrypt$whatever', 'x')).toBe(false);
  });

  test('the dummy hash is a valid hash that matches no ordinary password', async () => {
    const d = await dummyHash();
    expect(d.startsWith('scrypt$')).toBe(true);
    expect(await verifyPassword(d, 'armilla-demo')).toBe(false);
    expect(await dummyHash()).toBe(d);
  });
});
