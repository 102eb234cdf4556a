/**
 * Whom to believe about the client: the TCP peer, unless `TRUST_PROXY` names the proxies in front of us.
 *
 *   TRUST_PROXY unset, "", "0", "false"  → the socket's address; X-Forwarded-* headers are ignored
 *   TRUST_PROXY=1 (a hop count n)          → the address n entries from the right of X-Forwarded-For + peer
 *   TRUST_PROXY=10.0.0.2,10.0.0.3          → walk X-Forwarded-For from the right past these addresses
 *   ("loopback" stands for 127.0.0.1 and ::1)
 *
 * X-Forwarded-Host and X-Forwarded-Proto are believed only when the peer itself is a trusted proxy, and
 * then only the value the nearest proxy wrote (the last one). Pure: no environment read here except in
 * `trustFromEnv`, so tests pass their own setting.
 */

export type ProxyTrust = { kind: 'none' } | { kind: 'hops'; hops: number } | { kind: 'addresses'; addresses: Set<string> };

const LOOPBACK = ['127.0.0.1', '::1'];

/** "::ffff:127.0.0.1" → "127.0.0.1"; brackets and zone ids off. */
export function normaliseAddress(a: string): string {
  let s = a.trim().toLowerCase();
  if (s.startsWith('[') && s.includes(']')) s = s.slice(1, s.indexOf(']'));
  if (s.startsWith('::ffff:') && s.includes('.')) s = s.slice(7);
  return s;
}

export function parseTrustProxy(value: string | undefined): ProxyTrust {
  const v = (value ?? '').trim().toLowerCase();
  if (v === '' || v === '0' || v === 'false' || v === 'no') return { kind: 'none' };
  if (/^\d+$/.test(v)) return { kind: 'hops', hops: Math.min(16, Number(v)) };
  if (v === 'true') return { kind: 'hops', hops: 1 };
  const addresses = new Set<string>();
  for (const part of v.split(',').map((x) => x.trim()).filter(Boolean)) {
    if (part === 'loopback') LOOPBACK.forEach((a) => addresses.add(a));
    else addresses.add(normaliseAddress(part));
  }
  return addresses.size ? { kind: 'addresses', addresses } : { kind: 'none' };
}

let cached: { raw: string | undefined; trust: ProxyTrust } | null = null;
/** `TRUST_PROXY` of the running process (read at run time, like PUBLIC_ORIGIN). */
export function trustFromEnv(): ProxyTrust {
  const raw = process.env.TRUST_PROXY;
  if (!cached || cached.raw !== raw) cached = { raw, trust: parseTrustProxy(raw) };
  return cached.trust;
}

const list = (h: string | null) => (h ?? '').split(',').map((x) => x.trim()).filter(Boolean);

export function isTrustedPeer(peer: string, trust: ProxyTrust): boolean {
  if (trust.kind === 'none') return false;
  if (trust.kind === 'hops') return trust.hops >= 1;
  return trust.addresses.has(normaliseAddress(peer));
}

/** The client's address: the peer, or the forwarded address the trusted proxies vouch for. */
export function resolveClientAddress(peer: string, forwardedFor: string | null, trust: ProxyTrust): string {
  const p = normaliseAddress(peer);
  if (trust.kind === 'none' || !isTrustedPeer(p, trust)) return p;
  const chain = [...list(forwardedFor).map(normaliseAddress), p];
  if (trust.kind === 'hops') return chain[Math.max(0, chain.length - 1 - trust.hops)]!;
  let i = chain.length - 1;
  while (i > 0 && trust.addresses.has(chain[i]!)) i--;
  return chain[i]!;
}

/** Host and scheme the client used: from the trusted proxy's headers, else from Host and the socket. */
export function resolveOriginParts(
  headers: Headers,
  peer: string,
  encrypted: boolean,
  trust: ProxyTrust,
): { host: string | null; proto: 'http' | 'https' } {
  let host = headers.get('host');
  let proto: 'http' | 'https' = encrypted ? 'https' : 'http';
  if (isTrustedPeer(peer, trust)) {
    const fh = list(headers.get('x-forwarded-host')).at(-1);
    const fp = list(headers.get('x-forwarded-proto')).at(-1)?.toLowerCase();
    if (fh) host = fh;
    if (fp === 'http' || fp === 'https') proto = fp;
  }
  return { host: host ? host.toLowerCase() : null, proto };
}
