import { scrypt, randomBytes, timingSafeEqual, type ScryptOptions } from 'node:crypto';
import { availableParallelism } from 'node:os';

// scrypt is memory-hard (RFC 7914). N=2^15, r=8 uses 32 MiB per hash: ~70 ms on this class of machine.
const PARAMS = { N: 1 << 15, r: 8, p: 1, maxmem: 64 * 1024 * 1024 } satisfies ScryptOptions;
const KEYLEN = 32;

/**
 * At most this many hashes at once per process (cores − 1, at least 1); the others wait their turn. Each
 * is ~70 ms of a core: forty sign-ins at once would otherwise take every core from the event loop
 * (issue 17: `/api/health` stalled for seconds behind a burst of sign-ins).
 */
const MAX_CONCURRENT = Math.max(1, availableParallelism() - 1);
let running = 0;
const waiting: (() => void)[] = [];

async function derive(password: string, salt: Buffer, p: ScryptOptions): Promise<Buffer> {
  if (running >= MAX_CONCURRENT) await new Promise<void>((go) => waiting.push(go));
  else running++;
  try {
    return await new Promise((res, rej) => scrypt(password.normalize('NFKC'), salt, KEYLEN, p, (e, k) => (e ? rej(e) : res(k))));
  } finally {
    const next = waiting.shift();
    if (next) next();
    else running--;
  }
}

/** `scrypt$N$r$p$salt$hash` (base64url): the parameters travel with the hash so they can be raised later. */
export async function hashPassword(password: string): Promise<string> {
  const salt = randomBytes(16);
  const key = await derive(password, salt, PARAMS);
  return ['scrypt', PARAMS.N, PARAMS.r, PARAMS.p, salt.toString('base64url'), key.toString('base64url')].join('$');
}

export async function verifyPassword(stored: string, password: string): Promise<boolean> {
  const [alg, n, r, p, salt, hash] = stored.split('$');
  if (alg !== 'scrypt' || !salt || !hash) return false;
  const expected = Buffer.from(hash, 'base64url');
  const key = await derive(password, Buffer.from(salt, 'base64url'), {
    N: Number(n), r: Number(r), p: Number(p), maxmem: PARAMS.maxmem,
  });
  return key.length === expected.length && timingSafeEqual(key, expected);
}

/** A hash of a random password: compared against when the e-mail is unknown so timing does not reveal accounts. */
let dummy: Promise<string> | undefined;
export function dummyHash(): Promise<string> {
  return (dummy ??= hashPassword(randomBytes(16).toString('hex')));
}
